import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { db } from "../client";
import { complications } from "../schema";
import { loadVisit, lockDraftVisit } from "./visit-access";
import type { SiteScope } from "./scope";
import { AppError } from "@/lib/errors";
import type { ComplicationInput } from "@/lib/validation/visit-record";

const columns = { id: complications.id, kind: complications.kind, severity: complications.severity, afterProcedure: complications.afterProcedure, note: complications.note };

export async function listComplications(scope: SiteScope, visitId: string) {
  const v = await loadVisit(db, scope, visitId);
  const rows = await db.select(columns).from(complications).where(eq(complications.visitId, v.id)).orderBy(asc(complications.afterProcedure), asc(complications.kind));
  return { visit: v, complications: rows.map(({ afterProcedure, ...r }) => ({ ...r, timing: afterProcedure ? ("after" as const) : ("during" as const) })) };
}

export async function addComplication(scope: SiteScope, visitId: string, input: ComplicationInput) {
  return db.transaction(async (tx) => {
    const v = await lockDraftVisit(tx, scope, visitId);
    const [row] = await tx
      .insert(complications)
      .values({ visitId: v.id, siteId: v.siteId, kind: input.kind, severity: input.severity, afterProcedure: input.timing === "after", note: input.note ?? null })
      .returning({ id: complications.id });
    return { visit: v, id: row!.id };
  });
}

export async function deleteComplication(scope: SiteScope, visitId: string, complicationId: string) {
  return db.transaction(async (tx) => {
    const v = await lockDraftVisit(tx, scope, visitId);
    const gone = await tx.delete(complications).where(and(eq(complications.id, complicationId), eq(complications.visitId, v.id))).returning({ id: complications.id });
    if (!gone.length) throw new AppError("not_found");
    return { visit: v };
  });
}
