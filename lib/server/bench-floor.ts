import "server-only";
// What every write costs before it does anything of its own: BEGIN, one trivial statement, COMMIT
// on a pooled connection. `npm run bench` measures the working mix against the route that runs it
// (app/api/bench/write-floor), so the write path is judged against a transactional floor on the
// same server in the same run rather than only against constant JSON.
import { db } from "@/db/client";
import { trivialSelect } from "@/db/queries/bench-floor";

export async function transactionFloor(): Promise<void> {
  await db.transaction((tx) => trivialSelect(tx));
}
