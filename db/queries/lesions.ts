import "server-only";
import { and, asc, eq, sql as dsql } from "drizzle-orm";
import { db, prepared, preparedSql, type Tx } from "../client";
import { biopsies, lesions, lesionTracks, treatments } from "../schema";
import { inScopeParam, pgArrayLiteral, siteIdsParam, type SiteScope } from "./scope";
import { loadVisitAudited } from "./visit-access";
import { auditOfWrite, auditValues, type AuditInput, type ReadAudit } from "./audit-write";
import type { Grade, Histology, Zone } from "@/lib/domain/vocab";
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

// The columns of a lesion row written by the statements below, as the DTO names them, read from
// the CTE that wrote it (aliased "lesions", so the column and decoration fragments above apply).
const writtenColumns = (columns: Record<string, unknown>) =>
  dsql.join(Object.entries(columns).map(([name, column]) => dsql`${column} as ${dsql.identifier(name)}`), dsql`, `);

export interface NewLesion {
  id: string; trackId: string; visitId: string; siteId: string; patientId: string;
  clockStartH: number; clockEndH: number; distanceStartCm: number; distanceEndCm: number; zone: Zone; grade: Grade;
  morphology: string | null; acetowhite: string | null; lugol: string | null; vessels: string[]; sizeMm: number | null; note: string | null; clientKey: string | null;
}

const ph = (name: string) => dsql.placeholder(name);
const insertWithTrack = preparedSql<LesionRow>(dsql`
    with track as (
      insert into ${lesionTracks} (id, patient_id, site_id, label)
      -- Same rule as lib/domain/track-label.ts nextTrackLabel ("#" and the next number); a test checks both.
      select ${ph("trackId")}::uuid, ${ph("patientId")}::uuid, ${ph("siteId")}::uuid,
        '#' || (select coalesce(max(substring(label from 2)::int), 0) + 1 from ${lesionTracks} where patient_id = ${ph("patientId")}::uuid and label ~ '^#[0-9]+$')
      where not exists (select 1 from ${lesions} where visit_id = ${ph("visitId")}::uuid and client_key = ${ph("clientKey")}::uuid)
      returning id, label
    ), made as (
      insert into ${lesions} (id, visit_id, site_id, track_id, label, clock_start_h, clock_end_h, distance_start_cm, distance_end_cm, zone, grade, morphology, acetowhite, lugol, vessels, size_mm, note, client_key)
      select ${ph("id")}::uuid, ${ph("visitId")}::uuid, ${ph("siteId")}::uuid, track.id,
        'L' || (select coalesce(max(substring(label from 2)::int), 0) + 1 from ${lesions} where visit_id = ${ph("visitId")}::uuid and label ~ '^L[0-9]+$'),
        ${ph("clockStartH")}::float8, ${ph("clockEndH")}::float8, ${ph("distanceStartCm")}::float8, ${ph("distanceEndCm")}::float8, ${ph("zone")}::zone, ${ph("grade")}::grade,
        ${ph("morphology")}::morphology, ${ph("acetowhite")}::acetowhite, ${ph("lugol")}::lugol, ${ph("vessels")}::text[], ${ph("sizeMm")}::float8, ${ph("note")}::text, ${ph("clientKey")}::uuid
      from track
      returning *
    ), audit as (${auditOfWrite(dsql`from made`)})
    select ${writtenColumns(lesionColumns)} from made as "lesions" inner join track as "lesion_tracks" on true`);

/**
 * A new lesion on a track of its own, and its audit, in one statement (one round trip). The track
 * gets the patient's next label, the lesion the visit's next (the caller holds the visit and the
 * patient locked). A create sent again with a client key already used at the visit (its first
 * answer was lost) writes nothing and yields no row: the statement runs after the lock is held,
 * with a snapshot that sees the first create.
 */
export async function insertLesionWithTrack(tx: Tx, l: NewLesion, audit: AuditInput): Promise<LesionRow | null> {
  const [row] = await insertWithTrack(tx, { ...l, vessels: pgArrayLiteral(l.vessels), ...auditValues(audit) });
  return row ?? null;
}

export const lesionByClientKey = prepared((run) =>
  run.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.visitId, ph("visitId")), eq(lesions.clientKey, ph("clientKey")))),
);


/** The track, when it belongs to the patient. */
export async function trackOfPatient(tx: Tx, trackId: string, patientId: string) {
  const [track] = await tx.select({ id: lesionTracks.id }).from(lesionTracks).where(and(eq(lesionTracks.id, trackId), eq(lesionTracks.patientId, patientId)));
  return track ?? null;
}

// Every field a lesion update may change is written each time (the service sends the stored
// value for a field left out), so the statement is one text, built once.
const updateWithAudit = preparedSql<DecoratedRow>(dsql`
    with changed as (
      update ${lesions} set track_id = ${ph("trackId")}::uuid, clock_start_h = ${ph("clockStartH")}::float8, clock_end_h = ${ph("clockEndH")}::float8,
        distance_start_cm = ${ph("distanceStartCm")}::float8, distance_end_cm = ${ph("distanceEndCm")}::float8, zone = ${ph("zone")}::zone, grade = ${ph("grade")}::grade,
        morphology = ${ph("morphology")}::morphology, acetowhite = ${ph("acetowhite")}::acetowhite, lugol = ${ph("lugol")}::lugol, vessels = ${ph("vessels")}::text[],
        size_mm = ${ph("sizeMm")}::float8, note = ${ph("note")}::text, version = version + 1, updated_at = now()
      where id = ${ph("lesionId")}::uuid and version = ${ph("version")}::int
      returning *
    ), audit as (${auditOfWrite(dsql`from changed`)})
    select ${writtenColumns({ ...lesionColumns, ...decorationColumns })} from changed as "lesions" left join ${lesionTracks} on ${lesionTracks.id} = "lesions"."track_id"`);

/** A lesion's editable fields as they are to be stored. */
export interface LesionFields {
  trackId: string | null; clockStartH: number; clockEndH: number; distanceStartCm: number; distanceEndCm: number; zone: Zone; grade: Grade;
  morphology: string | null; acetowhite: string | null; lugol: string | null; vessels: string[]; sizeMm: number | null; note: string | null;
}

/**
 * Writes a lesion's fields if its version is still `version`, with its audit, and answers the
 * lesion as saved (as the map shows it), in one statement; null when the version had moved on.
 */
export async function updateLesionWithAudit(tx: Tx, lesionId: string, version: number, fields: LesionFields, audit: AuditInput): Promise<LesionDto | null> {
  const [row] = await updateWithAudit(tx, { ...fields, vessels: pgArrayLiteral(fields.vessels), lesionId, version, ...auditValues(audit) });
  return row ? toDto(row) : null;
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
