import "server-only";
// The benchmark's transactional floor: the cheapest statement there is, built once.
import { sql as dsql } from "drizzle-orm";
import { prepared, type Tx } from "../client";

const selectOne = prepared((run) => run.select({ one: dsql<number>`1` }).from(dsql`(select) as one`));

export function trivialSelect(tx: Tx) {
  return selectOne(tx);
}
