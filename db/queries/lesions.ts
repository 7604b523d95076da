import "server-only";
import { and, asc, eq, inArray, isNotNull, sql as dsql } from "drizzle-orm";
import { db, type Tx } from "../client";
import { biopsies, lesions, lesionTracks, sites, treatments } from "../schema";
import type { SiteScope } from "./scope";
import { loadVisit, lockDraftVisit } from "./visit-access";
import { refreshTrackStatuses } from "./tracking";
import { recordAudit } from "./audit";
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

type LesionRow = Omit<LesionDto, "histology" | "biopsyLabels" | "treated">;

async function decorate(run: typeof db | Tx, rows: LesionRow[]): Promise<LesionDto[]> {
  if (rows.length === 0) return [];
  const ids = rows.map((r) => r.id);
  const [bx, tx] = await Promise.all([
    run.select({ lesionId: biopsies.lesionId, label: biopsies.specimenLabel, histology: biopsies.histology }).from(biopsies).where(inArray(biopsies.lesionId, ids)).orderBy(asc(biopsies.specimenLabel)),
    run.selectDistinct({ lesionId: treatments.lesionId }).from(treatments).where(and(inArray(treatments.lesionId, ids), isNotNull(treatments.lesionId))),
  ]);
  const treated = new Set(tx.map((t) => t.lesionId));
  return rows.map((r) => {
    const mine = bx.filter((b) => b.lesionId === r.id);
    let histology: Histology | null = null;
    for (const b of mine) if (b.histology && (!histology || HISTOLOGY.indexOf(b.histology) > HISTOLOGY.indexOf(histology))) histology = b.histology;
    return { ...r, vessels: r.vessels as LesionDto["vessels"], histology, biopsyLabels: mine.map((b) => b.label), treated: treated.has(r.id) };
  });
}

export async function listLesionsForVisit(scope: SiteScope, visitId: string): Promise<VisitMapDto> {
  const visit = await loadVisit(db, scope, visitId);
  const rows = await db
    .select(lesionColumns)
    .from(lesions)
    .leftJoin(lesionTracks, eq(lesionTracks.id, lesions.trackId))
    .where(eq(lesions.visitId, visit.id))
    .orderBy(asc(lesions.createdAt), asc(lesions.id));
  return {
    visit: { id: visit.id, patientId: visit.patientId, visitDate: visit.visitDate, status: visit.status, patientPosition: visit.patientPosition, readOnly: visit.status === "signed" },
    lesions: await decorate(db, rows as LesionRow[]),
  };
}

async function zoneBoundsFor(tx: Tx, siteId: string): Promise<ZoneBounds> {
  const [s] = await tx.select({ zoneBounds: sites.zoneBounds }).from(sites).where(eq(sites.id, siteId));
  const parsed = zoneBoundsSchema.safeParse(s?.zoneBounds);
  return parsed.success ? parsed.data : DEFAULT_ZONE_BOUNDS;
}

function zoneFor(bounds: ZoneBounds, startCm: number, endCm: number) {
  const z = zoneForDistance((startCm + endCm) / 2, bounds);
  if (!z) throw new AppError("invalid", undefined, { distanceStartCm: ["This distance lies outside the mapped zones."] });
  return z;
}

async function nextNumber(tx: Tx, query: ReturnType<typeof dsql>): Promise<number> {
  const rows = (await tx.execute(query)) as unknown as { m: number | null }[];
  return (rows[0]?.m ?? 0) + 1;
}

async function fetchOne(tx: Tx, id: string): Promise<LesionDto> {
  const rows = await tx.select(lesionColumns).from(lesions).leftJoin(lesionTracks, eq(lesionTracks.id, lesions.trackId)).where(eq(lesions.id, id));
  return (await decorate(tx, rows as LesionRow[]))[0]!;
}

/** A new lesion starts its own track; linking it to an earlier track is a separate, audited step. */
export async function createLesion(scope: SiteScope, visitId: string, input: CreateLesionInput, ip: string): Promise<LesionDto> {
  return db.transaction(async (tx) => {
    const visit = await lockDraftVisit(tx, scope, visitId);
    const bounds = await zoneBoundsFor(tx, visit.siteId);
    // Track labels are per patient: lock the patient so two visits cannot take the same label.
    await tx.execute(dsql`select id from patients where id = ${visit.patientId} for update`);
    const n = await nextNumber(tx, dsql`select max(substring(label from 2)::int) as m from lesions where visit_id = ${visit.id} and label ~ '^L[0-9]+$'`);
    const t = await nextNumber(tx, dsql`select max(substring(label from 2)::int) as m from lesion_tracks where patient_id = ${visit.patientId} and label ~ '^T[0-9]+$'`);
    const [track] = await tx.insert(lesionTracks).values({ patientId: visit.patientId, siteId: visit.siteId, label: `T${t}` }).returning({ id: lesionTracks.id });
    const [row] = await tx
      .insert(lesions)
      .values({
        ...input,
        vessels: input.vessels ?? [],
        visitId: visit.id,
        siteId: visit.siteId,
        trackId: track!.id,
        label: `L${n}`,
        zone: zoneFor(bounds, input.distanceStartCm, input.distanceEndCm),
      })
      .returning({ id: lesions.id });
    await refreshTrackStatuses(tx, visit.patientId, visit.siteId);
    await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "lesion.create", entityType: "lesion", entityId: row!.id, ip, detail: { ...input } }, tx);
    return fetchOne(tx, row!.id);
  });
}

export async function updateLesion(scope: SiteScope, visitId: string, lesionId: string, input: UpdateLesionInput, ip: string): Promise<LesionDto> {
  return db.transaction(async (tx) => {
    const visit = await lockDraftVisit(tx, scope, visitId);
    const [current] = await tx.select().from(lesions).where(and(eq(lesions.id, lesionId), eq(lesions.visitId, visit.id)));
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
    const bounds = await zoneBoundsFor(tx, visit.siteId);
    const updated = await tx
      .update(lesions)
      .set({ ...fields, ...(trackId !== undefined ? { trackId } : {}), zone: zoneFor(bounds, start, end), version: current.version + 1, updatedAt: new Date() })
      .where(and(eq(lesions.id, lesionId), eq(lesions.version, version)))
      .returning({ id: lesions.id });
    if (updated.length === 0) throw new AppError("conflict");
    await refreshTrackStatuses(tx, visit.patientId, visit.siteId);
    await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "lesion.update", entityType: "lesion", entityId: lesionId, ip, detail: { ...input } }, tx);
    return fetchOne(tx, lesionId);
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
