import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db, type Tx } from "../client";
import { complications } from "../schema";

const columns = { id: complications.id, kind: complications.kind, severity: complications.severity, afterProcedure: complications.afterProcedure, note: complications.note };

export function complicationsOfVisit(visitId: string) {
  return db.select(columns).from(complications).where(eq(complications.visitId, visitId)).orderBy(asc(complications.afterProcedure), asc(complications.kind));
}

export async function insertComplication(tx: Tx, values: typeof complications.$inferInsert): Promise<string> {
  const [row] = await tx.insert(complications).values(values).returning({ id: complications.id });
  return row!.id;
}

export async function deleteComplicationRow(tx: Tx, complicationId: string, visitId: string): Promise<boolean> {
  const gone = await tx.delete(complications).where(and(eq(complications.id, complicationId), eq(complications.visitId, visitId))).returning({ id: complications.id });
  return gone.length > 0;
}
