import "server-only";
import { randomUUID } from "node:crypto";
import { db } from "@/db/client";
import {
  deleteLesionRow, deleteTrackIfUnused, fetchLesion, insertLesionWithTrack, lesionByClientKey, trackOfPatient, updateLesionWithAudit,
} from "@/db/queries/lesions";
import { lockDraftVisitForLesion } from "@/db/queries/visit-access";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { DEFAULT_ZONE_BOUNDS, zoneBoundsSchema, zoneForDistance, type ZoneBounds } from "@/lib/geometry/zones";
import type { CreateLesionInput, LesionDto, UpdateLesionInput } from "@/lib/validation/lesions";
import { endOf12IsWholeCircle, FULL_CIRCLE_ONLY_MESSAGE } from "@/lib/validation/clock";

function boundsOf(zoneBounds: unknown): ZoneBounds {
  const parsed = zoneBoundsSchema.safeParse(zoneBounds);
  return parsed.success ? parsed.data : DEFAULT_ZONE_BOUNDS;
}

function zoneFor(bounds: ZoneBounds, startCm: number, endCm: number) {
  const z = zoneForDistance((startCm + endCm) / 2, bounds);
  if (!z) throw new AppError("invalid", undefined, { distanceStartCm: ["This distance lies outside the mapped zones."] });
  return z;
}

// Lesions are written only on draft visits (the lock statement refuses a signed one), and track
// statuses come from signed visits alone (lib/tracking/histories.ts): a lesion write changes no
// status, so it neither takes the patient's status lock nor works statuses out. Signing does that
// for the whole visit (lib/server/signing.ts).

/** A new lesion starts its own track; linking it to an earlier track is a separate, audited step. */
export async function createLesion(scope: SiteScope, visitId: string, input: CreateLesionInput, ip: string): Promise<LesionDto> {
  return db.transaction(async (tx) => {
    // Track labels are per patient: the patient is locked with the visit so two visits cannot take
    // the same label. The same create sent again (its first answer was lost) is answered with the
    // lesion it made.
    const { visit } = await lockDraftVisitForLesion(tx, scope, visitId, { lockPatient: true });
    const zone = zoneFor(boundsOf(visit.zoneBounds), input.distanceStartCm, input.distanceEndCm);
    const lesionId = randomUUID();
    // The track, the lesion on it and the audit: one statement, sent once the lock is held.
    const row = await insertLesionWithTrack(
      tx,
      {
        id: lesionId,
        trackId: randomUUID(),
        visitId: visit.id,
        siteId: visit.siteId,
        patientId: visit.patientId,
        clockStartH: input.clockStartH,
        clockEndH: input.clockEndH,
        distanceStartCm: input.distanceStartCm,
        distanceEndCm: input.distanceEndCm,
        zone,
        grade: input.grade,
        morphology: input.morphology ?? null,
        acetowhite: input.acetowhite ?? null,
        lugol: input.lugol ?? null,
        vessels: input.vessels ?? [],
        sizeMm: input.sizeMm ?? null,
        note: input.note ?? null,
        clientKey: input.clientKey ?? null,
      },
      { userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "lesion.create", entityType: "lesion", entityId: lesionId, ip, detail: { ...input } },
    );
    // Nothing written: the same create was made before (its client key is taken at this visit).
    if (!row) {
      const [made] = await lesionByClientKey(tx, { visitId: visit.id, clientKey: input.clientKey });
      return fetchLesion(tx, made!.id);
    }
    // A lesion created just now has no biopsy and no treatment yet.
    return { ...row, vessels: row.vessels as LesionDto["vessels"], histology: null, biopsyLabels: [], treated: false };
  });
}

/** The fields an update sends, without those it leaves out. */
function definedOnly<T extends object>(fields: T): Partial<T> {
  return Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/** Whether every value an update sends equals the stored one (a field left out is unchanged). */
function unchanged(input: UpdateLesionInput, current: Record<string, unknown>): boolean {
  return Object.entries(input).every(([field, value]) => field === "version" || value === undefined || JSON.stringify(value) === JSON.stringify(current[field] ?? null));
}

export async function updateLesion(scope: SiteScope, visitId: string, lesionId: string, input: UpdateLesionInput, ip: string): Promise<LesionDto> {
  return db.transaction(async (tx) => {
    const { visit, current } = await lockDraftVisitForLesion(tx, scope, visitId, { lesionId });
    if (!current) throw new AppError("not_found");
    if (current.version !== input.version) throw new AppError("conflict");
    const { version, trackId, ...fields } = input;
    // An update whose values all equal the stored ones (a form saved again, a tap that moved
    // nothing) changes nothing: no new version, no audit row.
    if (unchanged(input, current)) return fetchLesion(tx, lesionId);
    if (trackId !== undefined && trackId !== null) {
      if (!(await trackOfPatient(tx, trackId, visit.patientId))) throw new AppError("invalid", undefined, { trackId: ["That track does not belong to this patient."] });
    }
    const start = fields.distanceStartCm ?? current.distanceStartCm;
    const end = fields.distanceEndCm ?? current.distanceEndCm;
    if (start > end) throw new AppError("invalid", undefined, { distanceEndCm: ["The distance range must run from the lower to the higher value."] });
    if (!endOf12IsWholeCircle(fields.clockStartH ?? current.clockStartH, fields.clockEndH ?? current.clockEndH)) {
      throw new AppError("invalid", undefined, { clockEndH: [FULL_CIRCLE_ONLY_MESSAGE] });
    }
    const zone = zoneFor(boundsOf(visit.zoneBounds), start, end);
    // The update, its audit and the lesion as saved: one statement. Should the version have moved
    // on, it writes nothing.
    const lesion = await updateLesionWithAudit(
      tx,
      lesionId,
      version,
      // A field the update leaves out keeps its stored value (null clears one).
      // (`current` also carries the lesion's id and version; the statement takes neither from here.)
      { ...current, vessels: current.vessels as string[], ...definedOnly(fields), ...(trackId !== undefined ? { trackId } : {}), distanceStartCm: start, distanceEndCm: end, zone },
      { userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "lesion.update", entityType: "lesion", entityId: lesionId, ip, detail: { ...input } },
    );
    if (!lesion) throw new AppError("conflict");
    return lesion;
  });
}

export async function deleteLesion(scope: SiteScope, visitId: string, lesionId: string, version: number, ip: string): Promise<void> {
  await db.transaction(async (tx) => {
    const { visit, current } = await lockDraftVisitForLesion(tx, scope, visitId, { lesionId });
    if (!current) throw new AppError("not_found");
    if (current.version !== version) throw new AppError("conflict");
    // The lesion, then its track if no lesion anywhere is left on it (it was only this lesion's),
    // and the audit: sent together, in this order.
    await Promise.all([
      deleteLesionRow(tx, lesionId),
      current.trackId ? deleteTrackIfUnused(tx, current.trackId) : null,
      recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "lesion.delete", entityType: "lesion", entityId: lesionId, ip }, tx),
    ]);
  });
}
