// Derived data computed after the demo rows exist: every track's status at every visit.
import { db } from "../client";
import { patients } from "../schema";
import { refreshTrackStatuses } from "@/lib/server/track-statuses";

export async function afterSeed(): Promise<void> {
  const all = await db.select({ id: patients.id, siteId: patients.siteId }).from(patients);
  for (const p of all) await refreshTrackStatuses(db, p.id, p.siteId);
}
