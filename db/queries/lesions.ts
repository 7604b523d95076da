import "server-only";
import { and, asc, eq, sql as dsql } from "drizzle-orm";
import { db, prepared, type Tx } from "../client";
import { biopsies, lesions, lesionTracks, treatments } from "../schema";
import { inScopeParam, siteIdsParam, type SiteScope } from "./scope";
import { loadVisitAudited } from "./visit-access";
import type { ReadAudit } from "./audit-write";
import type { Histology } from "@/lib/domain/vocab";
import { worstHistology } from "@/lib/tracking/histories";
import type { LesionDto, VisitMapDto } from "@/lib/validation/lesions";

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
  // Treated at its visit: named by a treatment, or among the lesions a treatment's arcs treated.
  treated: dsql<boolean>`exists(select 1 from ${treatments} where ${treatments.lesionId} = ${lesions.id} or (${treatments.visitId} = ${lesions.visitId} and ${lesions.id} = any(${treatments.treatedLesionIds})))`,
};

export type LesionRow = Omit<LesionDto, "histology" | "biopsyLabels" | "treated">;
// The lesion row's own columns (the track label comes from the joined track).
const lesionColumnsOfRow = Object.fromEntries(Object.entries(lesionColumns).filter(([k]) => k !== "trackLabel")) as Omit<typeof lesionColumns, "trackLabel">;
type DecoratedRow = LesionRow & { biopsyLabels: string[]; histologies: string[]; treated: boolean };

function toDto({ histologies, ...r }: DecoratedRow): LesionDto {
  return { ...r, vessels: r.vessels as LesionDto["vessels"], histology: worstHistology(histologies as Histology[]) };
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
/** With `patientId`, a visit of another patient is not found (and no read is recorded). */
export async function listLesionsForVisit(scope: SiteScope, visitId: string, audit: ReadAudit, patientId?: string): Promise<VisitMapDto> {
  // The lesions are read beside the visit, filtered by the same site scope; kept only if the visit is.
  const [visit, rows] = await Promise.all([
    loadVisitAudited(db, scope, visitId, audit, patientId),
    lesionsOfVisit(db, { visitId, siteIds: siteIdsParam(scope) }),
  ]);
  return {
    visit: { id: visit.id, patientId: visit.patientId, visitDate: visit.visitDate, status: visit.status, patientPosition: visit.patientPosition, readOnly: visit.status === "signed" },
    lesions: (rows as DecoratedRow[]).map(toDto),
  };
}

/** One lesion as the map shows it. */
export async function fetchLesion(tx: Tx, id: string): Promise<LesionDto> {
  const rows = await lesionById(tx, { id });
  return toDto(rows[0] as DecoratedRow);
}

// A new lesion's track and the lesion itself, each built once. Both ids are made here, so the two
// inserts and everything that follows them go out together (one round trip in the transaction).
const ph = (name: string) => dsql.placeholder(name);
export const insertTrack = prepared((run) =>
  run
    .insert(lesionTracks)
    .values({
      id: ph("id"),
      patientId: ph("patientId"),
      siteId: ph("siteId"),
      // Same rule as lib/domain/track-label.ts nextTrackLabel ("#" and the next number); a test checks both.
      label: dsql`'#' || (select coalesce(max(substring(label from 2)::int), 0) + 1 from lesion_tracks where patient_id = ${ph("patientId")} and label ~ '^#[0-9]+$')`,
    })
    .returning({ id: lesionTracks.id, label: lesionTracks.label }),
);
export const insertLesion = prepared((run) =>
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
export const lesionByClientKey = prepared((run) =>
  run.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.visitId, ph("visitId")), eq(lesions.clientKey, ph("clientKey")))),
);


/** The track, when it belongs to the patient. */
export async function trackOfPatient(tx: Tx, trackId: string, patientId: string) {
  const [track] = await tx.select({ id: lesionTracks.id }).from(lesionTracks).where(and(eq(lesionTracks.id, trackId), eq(lesionTracks.patientId, patientId)));
  return track ?? null;
}

/** Writes a lesion's new values if its version is still `version`; started at once (see the services' ordering note). */
export function updateLesionRow(tx: Tx, lesionId: string, version: number, set: Partial<typeof lesions.$inferInsert>) {
  return tx
    .update(lesions)
    .set({ ...set, version: version + 1, updatedAt: new Date() })
    .where(and(eq(lesions.id, lesionId), eq(lesions.version, version)))
    .returning({ id: lesions.id })
    .execute();
}

export async function deleteLesionRow(tx: Tx, lesionId: string): Promise<void> {
  await tx.delete(lesions).where(eq(lesions.id, lesionId));
}

/** Removes a track no lesion, track check or adjudication refers to any more (one statement). */
export async function deleteTrackIfUnused(tx: Tx, trackId: string): Promise<void> {
  await tx.execute(
    dsql`delete from lesion_tracks where id = ${trackId} and not exists (select 1 from lesions where track_id = ${trackId}) and not exists (select 1 from track_checks where track_id = ${trackId}) and not exists (select 1 from adjudications where track_id = ${trackId})`,
  );
}
