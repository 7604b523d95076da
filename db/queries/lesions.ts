import "server-only";
import { and, asc, eq, sql as dsql } from "drizzle-orm";
import type { AnyPgColumn } from "drizzle-orm/pg-core";
import { db, prepared, type Tx } from "../client";
import { biopsies, lesions, lesionTracks, treatments } from "../schema";
import { inScopeParam, pgArrayLiteral, siteIdsParam, type SiteScope } from "./scope";
import { loadVisitAudited } from "./visit-access";
import { auditOfWrite, type AuditInput, type ReadAudit } from "./audit-write";
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

/**
 * A new lesion on a track of its own, and its audit, in one statement (one round trip). The track
 * gets the patient's next label, the lesion the visit's next (the caller holds the visit and the
 * patient locked). A create sent again with a client key already used at the visit (its first
 * answer was lost) writes nothing and yields no row: the statement runs after the lock is held,
 * with a snapshot that sees the first create.
 */
export async function insertLesionWithTrack(tx: Tx, l: NewLesion, audit: AuditInput): Promise<LesionRow | null> {
  const rows = await tx.execute<LesionRow>(dsql`
    with track as (
      insert into ${lesionTracks} (id, patient_id, site_id, label)
      -- Same rule as lib/domain/track-label.ts nextTrackLabel ("#" and the next number); a test checks both.
      select ${l.trackId}::uuid, ${l.patientId}::uuid, ${l.siteId}::uuid,
        '#' || (select coalesce(max(substring(label from 2)::int), 0) + 1 from ${lesionTracks} where patient_id = ${l.patientId}::uuid and label ~ '^#[0-9]+$')
      where not exists (select 1 from ${lesions} where visit_id = ${l.visitId}::uuid and client_key = ${l.clientKey}::uuid)
      returning id, label
    ), made as (
      insert into ${lesions} (id, visit_id, site_id, track_id, label, clock_start_h, clock_end_h, distance_start_cm, distance_end_cm, zone, grade, morphology, acetowhite, lugol, vessels, size_mm, note, client_key)
      select ${l.id}::uuid, ${l.visitId}::uuid, ${l.siteId}::uuid, track.id,
        'L' || (select coalesce(max(substring(label from 2)::int), 0) + 1 from ${lesions} where visit_id = ${l.visitId}::uuid and label ~ '^L[0-9]+$'),
        ${l.clockStartH}::float8, ${l.clockEndH}::float8, ${l.distanceStartCm}::float8, ${l.distanceEndCm}::float8, ${l.zone}::zone, ${l.grade}::grade,
        ${l.morphology}::morphology, ${l.acetowhite}::acetowhite, ${l.lugol}::lugol, ${pgArrayLiteral(l.vessels)}::text[], ${l.sizeMm}::float8, ${l.note}::text, ${l.clientKey}::uuid
      from track
      returning *
    ), audit as (${auditOfWrite(audit, dsql`from made`)})
    select ${writtenColumns(lesionColumns)} from made as "lesions" inner join track as "lesion_tracks" on true`);
  return rows[0] ?? null;
}
const ph = (name: string) => dsql.placeholder(name);
export const lesionByClientKey = prepared((run) =>
  run.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.visitId, ph("visitId")), eq(lesions.clientKey, ph("clientKey")))),
);


/** The track, when it belongs to the patient. */
export async function trackOfPatient(tx: Tx, trackId: string, patientId: string) {
  const [track] = await tx.select({ id: lesionTracks.id }).from(lesionTracks).where(and(eq(lesionTracks.id, trackId), eq(lesionTracks.patientId, patientId)));
  return track ?? null;
}

/**
 * Writes a lesion's new values if its version is still `version`, with its audit, and answers the
 * lesion as saved (as the map shows it), in one statement; null when the version had moved on.
 */
export async function updateLesionWithAudit(tx: Tx, lesionId: string, version: number, set: Partial<typeof lesions.$inferInsert>, audit: AuditInput): Promise<LesionDto | null> {
  const assignments = Object.entries(set)
    .filter(([, value]) => value !== undefined)
    .map(([key, value]) => {
      const column = lesions[key as keyof typeof set & keyof typeof lesions] as AnyPgColumn;
      const bound = key === "vessels" ? dsql`${pgArrayLiteral(value as string[])}::text[]` : dsql`${value}`;
      return dsql`${dsql.identifier(column.name)} = ${bound}`;
    });
  const rows = await tx.execute<DecoratedRow>(dsql`
    with changed as (
      update ${lesions} set ${dsql.join([...assignments, dsql`version = ${version + 1}`, dsql`updated_at = now()`], dsql`, `)}
      where id = ${lesionId}::uuid and version = ${version}
      returning *
    ), audit as (${auditOfWrite(audit, dsql`from changed`)})
    select ${writtenColumns({ ...lesionColumns, ...decorationColumns })} from changed as "lesions" left join ${lesionTracks} on ${lesionTracks.id} = "lesions"."track_id"`);
  return rows[0] ? toDto(rows[0]) : null;
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
