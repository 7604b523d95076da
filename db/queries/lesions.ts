import "server-only";
import { randomUUID } from "node:crypto";
import { and, asc, eq, sql as dsql } from "drizzle-orm";
import { db, prepared, type Tx } from "../client";
import { biopsies, lesions, lesionTracks, treatments } from "../schema";
import { inScopeParam, siteIdsParam, type SiteScope } from "./scope";
import { loadVisitAudited, lockDraftVisit, lockDraftVisitForLesion } from "./visit-access";
import { refreshTrackStatuses } from "./tracking";
import { recordAudit, type ReadAudit } from "./audit-write";
import { AppError } from "@/lib/errors";
import { HISTOLOGY, type Histology } from "@/lib/domain/vocab";
import { DEFAULT_ZONE_BOUNDS, zoneBoundsSchema, zoneForDistance, type ZoneBounds } from "@/lib/geometry/zones";
import type { CreateLesionInput, LesionDto, UpdateLesionInput, VisitMapDto } from "@/lib/validation/lesions";

const lesionColumns = {
  id: lesions.id,
  visitId: lesions.visitId,
  trackId: lesions.trackId,
  trackLabel: lesionTracks.label,
  label: lesions.label,
  clockStartH: lesions.clockStartH,
  clockEndH: lesions.clockEndH,
  distanceStartCm: lesions.distanceStartCm,
  distanceEndCm: lesions.distanceEndCm,
  zone: lesions.zone,
  grade: lesions.grade,
  morphology: lesions.morphology,
  acetowhite: lesions.acetowhite,
  lugol: lesions.lugol,
  vessels: lesions.vessels,
  sizeMm: lesions.sizeMm,
  note: lesions.note,
  version: lesions.version,
};

// A lesion's biopsies and treatments, as columns of the same statement (no second round trip).
const decorationColumns = {
  biopsyLabels: dsql<string[]>`array(select ${biopsies.specimenLabel} from ${biopsies} where ${biopsies.lesionId} = ${lesions.id} order by 1)`,
  histologies: dsql<string[]>`array(select ${biopsies.histology}::text from ${biopsies} where ${biopsies.lesionId} = ${lesions.id} and ${biopsies.histology} is not null)`,
  treated: dsql<boolean>`exists(select 1 from ${treatments} where ${treatments.lesionId} = ${lesions.id})`,
};

type LesionRow = Omit<LesionDto, "histology" | "biopsyLabels" | "treated">;
const { trackLabel: _trackLabel, ...lesionColumnsOfRow } = lesionColumns;
type DecoratedRow = LesionRow & { biopsyLabels: string[]; histologies: string[]; treated: boolean };

function toDto({ histologies, ...r }: DecoratedRow): LesionDto {
  // The worst histology among the lesion's biopsies decides.
  let histology: Histology | null = null;
  for (const h of histologies as Histology[]) if (!histology || HISTOLOGY.indexOf(h) > HISTOLOGY.indexOf(histology)) histology = h;
  return { ...r, vessels: r.vessels as LesionDto["vessels"], histology };
}

const selectLesions = (run: typeof db | Tx) => run.select({ ...lesionColumns, ...decorationColumns }).from(lesions).leftJoin(lesionTracks, eq(lesionTracks.id, lesions.trackId));
// Built once: the map reads a visit's lesions on every open, and every update returns its lesion.
const lesionsOfVisit = prepared((run) =>
  selectLesions(run)
    .where(and(eq(lesions.visitId, dsql.placeholder("visitId")), inScopeParam(lesions.siteId)))
    .orderBy(asc(lesions.createdAt), asc(lesions.id)),
);
const lesionById = prepared((run) => selectLesions(run).where(eq(lesions.id, dsql.placeholder("id"))));

/**
 * A visit's map. The read is recorded (`audit`, entity: the visit) by the statement that reads
 * the visit, when the visit is in scope.
 */
export async function listLesionsForVisit(scope: SiteScope, visitId: string, audit: ReadAudit): Promise<VisitMapDto> {
  // The lesions are read beside the visit, filtered by the same site scope; kept only if the visit is.
  const [visit, rows] = await Promise.all([
    loadVisitAudited(db, scope, visitId, audit),
    lesionsOfVisit(db, { visitId, siteIds: siteIdsParam(scope) }),
  ]);
  return {
    visit: { id: visit.id, patientId: visit.patientId, visitDate: visit.visitDate, status: visit.status, patientPosition: visit.patientPosition, readOnly: visit.status === "signed" },
    lesions: (rows as DecoratedRow[]).map(toDto),
  };
}

function boundsOf(zoneBounds: unknown): ZoneBounds {
  const parsed = zoneBoundsSchema.safeParse(zoneBounds);
  return parsed.success ? parsed.data : DEFAULT_ZONE_BOUNDS;
}

function zoneFor(bounds: ZoneBounds, startCm: number, endCm: number) {
  const z = zoneForDistance((startCm + endCm) / 2, bounds);
  if (!z) throw new AppError("invalid", undefined, { distanceStartCm: ["This distance lies outside the mapped zones."] });
  return z;
}

async function fetchOne(tx: Tx, id: string): Promise<LesionDto> {
  const rows = await lesionById(tx, { id });
  return toDto(rows[0] as DecoratedRow);
}

// A new lesion's track and the lesion itself, each built once. Both ids are made here, so the two
// inserts and everything that follows them go out together (one round trip in the transaction).
const ph = (name: string) => dsql.placeholder(name);
const insertTrack = prepared((run) =>
  run
    .insert(lesionTracks)
    .values({
      id: ph("id"),
      patientId: ph("patientId"),
      siteId: ph("siteId"),
      label: dsql`'T' || (select coalesce(max(substring(label from 2)::int), 0) + 1 from lesion_tracks where patient_id = ${ph("patientId")} and label ~ '^T[0-9]+$')`,
    })
    .returning({ id: lesionTracks.id, label: lesionTracks.label }),
);
const insertLesion = prepared((run) =>
  run
    .insert(lesions)
    .values({
      id: ph("id"),
      visitId: ph("visitId"),
      siteId: ph("siteId"),
      trackId: ph("trackId"),
      label: dsql`'L' || (select coalesce(max(substring(label from 2)::int), 0) + 1 from lesions where visit_id = ${ph("visitId")} and label ~ '^L[0-9]+$')`,
      clockStartH: ph("clockStartH"),
      clockEndH: ph("clockEndH"),
      distanceStartCm: ph("distanceStartCm"),
      distanceEndCm: ph("distanceEndCm"),
      zone: ph("zone"),
      grade: ph("grade"),
      morphology: ph("morphology"),
      acetowhite: ph("acetowhite"),
      lugol: ph("lugol"),
      vessels: ph("vessels"),
      sizeMm: ph("sizeMm"),
      note: ph("note"),
      clientKey: ph("clientKey"),
    })
    .returning(lesionColumnsOfRow),
);
const lesionByClientKey = prepared((run) =>
  run.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.visitId, ph("visitId")), eq(lesions.clientKey, ph("clientKey")))),
);

/** A new lesion starts its own track; linking it to an earlier track is a separate, audited step. */
export async function createLesion(scope: SiteScope, visitId: string, input: CreateLesionInput, ip: string): Promise<LesionDto> {
  return db.transaction(async (tx) => {
    // Track labels are per patient: the patient is locked with the visit so two visits cannot take the same label.
    // The same create sent again (its first answer was lost) is answered with the lesion it made.
    // The client-key lookup goes out in the same round trip, right behind the lock on the
    // transaction's one connection, as a statement of its own: PostgreSQL runs it after the lock
    // is held, with a fresh snapshot (READ COMMITTED), so of two such requests the second sees the
    // first's row. (Inside the locking statement it would read the snapshot from before the wait.)
    // Its answer is used only once the lock has found the visit in the caller's scope.
    const [{ visit }, made] = await Promise.all([
      lockDraftVisitForLesion(tx, scope, visitId, { lockPatient: true }),
      input.clientKey ? lesionByClientKey(tx, { visitId, clientKey: input.clientKey }).then((rows) => rows[0]) : undefined,
    ]);
    if (made) return fetchOne(tx, made.id);
    const zone = zoneFor(boundsOf(visit.zoneBounds), input.distanceStartCm, input.distanceEndCm);
    const trackId = randomUUID();
    const lesionId = randomUUID();
    // Sent together, in the order they are started here on the transaction's one connection: the
    // track, the lesion on it, then (seeing both) the status refresh's read and the audit. A failed
    // insert fails the rest and the transaction.
    const [[track], [row]] = await Promise.all([
      insertTrack(tx, { id: trackId, patientId: visit.patientId, siteId: visit.siteId }),
      insertLesion(tx, {
        id: lesionId,
        visitId: visit.id,
        siteId: visit.siteId,
        trackId,
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
      }),
      refreshTrackStatuses(tx, visit.patientId, visit.siteId),
      recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "lesion.create", entityType: "lesion", entityId: lesionId, ip, detail: { ...input } }, tx),
    ]);
    // A lesion created just now has no biopsy and no treatment yet.
    return { ...(row as Omit<LesionRow, "trackLabel">), vessels: row!.vessels as LesionDto["vessels"], trackLabel: track!.label, histology: null, biopsyLabels: [], treated: false };
  });
}

export async function updateLesion(scope: SiteScope, visitId: string, lesionId: string, input: UpdateLesionInput, ip: string): Promise<LesionDto> {
  return db.transaction(async (tx) => {
    const { visit, current } = await lockDraftVisitForLesion(tx, scope, visitId, { lesionId });
    if (!current) throw new AppError("not_found");
    if (current.version !== input.version) throw new AppError("conflict");
    const { version, trackId, ...fields } = input;
    if (trackId !== undefined && trackId !== null) {
      const [track] = await tx.select({ id: lesionTracks.id }).from(lesionTracks).where(and(eq(lesionTracks.id, trackId), eq(lesionTracks.patientId, visit.patientId)));
      if (!track) throw new AppError("invalid", undefined, { trackId: ["That track does not belong to this patient."] });
    }
    const start = fields.distanceStartCm ?? current.distanceStartCm;
    const end = fields.distanceEndCm ?? current.distanceEndCm;
    if (start > end) throw new AppError("invalid", undefined, { distanceEndCm: ["The distance range must run from the lower to the higher value."] });
    const zone = zoneFor(boundsOf(visit.zoneBounds), start, end);
    // Track statuses are worked out from each lesion's grade and track, and from the patient's
    // visits, biopsies, treatments and track checks, which a lesion update does not touch. Moving
    // an extent or editing a description leaves them as they are: they are worked out again only
    // when the grade or the track changes.
    const statusesMayChange = (fields.grade !== undefined && fields.grade !== current.grade) || (trackId !== undefined && trackId !== current.trackId);
    // The update, then (seeing it) the status refresh's read, the audit and the lesion as saved:
    // sent together, in the order they are started here on the transaction's one connection (so
    // the update is started with execute(), not left for Promise.all to start after the others).
    // Should the update match no row, the transaction is rolled back with the rest.
    const [updated, , , lesion] = await Promise.all([
      tx
        .update(lesions)
        .set({ ...fields, ...(trackId !== undefined ? { trackId } : {}), zone, version: current.version + 1, updatedAt: new Date() })
        .where(and(eq(lesions.id, lesionId), eq(lesions.version, version)))
        .returning({ id: lesions.id })
        .execute(),
      statusesMayChange ? refreshTrackStatuses(tx, visit.patientId, visit.siteId) : null,
      recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "lesion.update", entityType: "lesion", entityId: lesionId, ip, detail: { ...input } }, tx),
      fetchOne(tx, lesionId),
    ]);
    if (updated.length === 0) throw new AppError("conflict");
    return lesion;
  });
}

export async function deleteLesion(scope: SiteScope, visitId: string, lesionId: string, version: number, ip: string): Promise<void> {
  await db.transaction(async (tx) => {
    const visit = await lockDraftVisit(tx, scope, visitId);
    const [current] = await tx.select({ version: lesions.version, trackId: lesions.trackId }).from(lesions).where(and(eq(lesions.id, lesionId), eq(lesions.visitId, visit.id)));
    if (!current) throw new AppError("not_found");
    if (current.version !== version) throw new AppError("conflict");
    await tx.delete(lesions).where(eq(lesions.id, lesionId));
    // A track left with no lesion anywhere was only this lesion's: remove it too.
    if (current.trackId) {
      const [{ left }] = await tx.select({ left: dsql<number>`count(*)::int` }).from(lesions).where(eq(lesions.trackId, current.trackId));
      if (left === 0) await tx.execute(dsql`delete from lesion_tracks where id = ${current.trackId} and not exists (select 1 from track_checks where track_id = ${current.trackId}) and not exists (select 1 from adjudications where track_id = ${current.trackId})`);
    }
    await refreshTrackStatuses(tx, visit.patientId, visit.siteId);
    await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "lesion.delete", entityType: "lesion", entityId: lesionId, ip }, tx);
  });
}
