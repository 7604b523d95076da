import "server-only";
import { and, asc, desc, eq, inArray, isNotNull, lt, sql as dsql } from "drizzle-orm";
import { db, type Tx } from "../client";
import { biopsies, keptNewLesions, lesions, lesionTracks, trackChecks, users, visits } from "../schema";
import type { TrackCheckOutcome } from "@/lib/domain/vocab";
import { nextTrackLabel } from "@/lib/domain/track-label";

/**
 * Which sightings count as "earlier" at a visit: lesions of the patient's visits dated before it
 * (joined to their visit). The follow-up list and signing's undecided-track check both read this,
 * so signing can never ask about a track the list does not show.
 */
export const earlierThan = (patientId: string, beforeDate: string) => and(eq(visits.patientId, patientId), lt(visits.visitDate, beforeDate));

/** Every lesion of the patient's visits before `beforeDate` that is on a track, newest first. */
export function earlierSightings(patientId: string, beforeDate: string) {
  return db
    .select({
      lesionId: lesions.id, trackId: lesions.trackId, trackLabel: lesionTracks.label, visitDate: visits.visitDate, label: lesions.label,
      clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH, distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm,
      zone: lesions.zone, grade: lesions.grade,
    })
    .from(lesions)
    .innerJoin(visits, eq(visits.id, lesions.visitId))
    .innerJoin(lesionTracks, eq(lesionTracks.id, lesions.trackId))
    .where(earlierThan(patientId, beforeDate))
    .orderBy(desc(visits.visitDate));
}

/** The biopsy results of some lesions (rows without a result left out). */
export function biopsyResultsOfLesions(lesionIds: string[]) {
  return db
    .select({ lesionId: biopsies.lesionId, histology: biopsies.histology })
    .from(biopsies)
    .where(and(inArray(biopsies.lesionId, lesionIds), isNotNull(biopsies.histology)));
}

export function lesionPlacesOfVisit(visitId: string) {
  return db
    .select({ id: lesions.id, trackId: lesions.trackId, label: lesions.label, clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH, distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm, zone: lesions.zone })
    .from(lesions)
    .where(eq(lesions.visitId, visitId))
    .orderBy(asc(lesions.label));
}

export function trackChecksOfVisit(visitId: string) {
  return db.select({ trackId: trackChecks.trackId, outcome: trackChecks.outcome }).from(trackChecks).where(eq(trackChecks.visitId, visitId));
}

/** Serialises track changes of one patient (labels are numbered per patient). */
export async function lockPatientRow(tx: Tx, patientId: string): Promise<void> {
  await tx.execute(dsql`select id from patients where id = ${patientId} for update`);
}

export async function trackIsPatients(tx: Tx, trackId: string, patientId: string): Promise<boolean> {
  const [t] = await tx.select({ id: lesionTracks.id }).from(lesionTracks).where(and(eq(lesionTracks.id, trackId), eq(lesionTracks.patientId, patientId)));
  return Boolean(t);
}

export async function lesionTrackOnVisit(tx: Tx, lesionId: string, visitId: string) {
  const [l] = await tx.select({ id: lesions.id, trackId: lesions.trackId }).from(lesions).where(and(eq(lesions.id, lesionId), eq(lesions.visitId, visitId)));
  return l ?? null;
}

/** The lesion of this visit on the track, if there is one. */
export async function lesionOfTrackOnVisit(tx: Tx, trackId: string, visitId: string) {
  const [l] = await tx.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.visitId, visitId), eq(lesions.trackId, trackId)));
  return l ?? null;
}

export async function setLesionTrack(tx: Tx, lesionId: string, trackId: string): Promise<void> {
  await tx.update(lesions).set({ trackId, version: dsql`${lesions.version} + 1` }).where(eq(lesions.id, lesionId));
}

/** A new track with the patient's next label (#1, #2…; lib/domain/track-label.ts). */
export async function insertNextTrack(tx: Tx, patientId: string, siteId: string): Promise<string> {
  const rows = await tx.select({ label: lesionTracks.label }).from(lesionTracks).where(eq(lesionTracks.patientId, patientId));
  const [t] = await tx.insert(lesionTracks).values({ patientId, siteId, label: nextTrackLabel(rows.map((r) => r.label)) }).returning({ id: lesionTracks.id });
  return t!.id;
}

/** Removes a track nothing refers to any more. */
export async function dropTrackIfEmpty(tx: Tx, trackId: string | null): Promise<void> {
  if (!trackId) return;
  await tx.execute(dsql`delete from lesion_tracks t where t.id = ${trackId}
    and not exists (select 1 from lesions where track_id = t.id)
    and not exists (select 1 from track_checks where track_id = t.id)
    and not exists (select 1 from adjudications where track_id = t.id)`);
}

export function sightingsOfTracks(tx: Tx, trackIds: string[]) {
  return tx.select({ visitId: lesions.visitId, trackId: lesions.trackId }).from(lesions).where(inArray(lesions.trackId, trackIds));
}

/** Moves every lesion and track check of one track onto another (a check the target has at that visit wins). */
export async function moveTrack(tx: Tx, fromTrackId: string, intoTrackId: string): Promise<void> {
  await tx.update(lesions).set({ trackId: intoTrackId }).where(eq(lesions.trackId, fromTrackId));
  await tx.execute(dsql`update track_checks set track_id = ${intoTrackId} where track_id = ${fromTrackId}
    and visit_id not in (select visit_id from track_checks where track_id = ${intoTrackId})`);
  await tx.delete(trackChecks).where(eq(trackChecks.trackId, fromTrackId));
}

export async function upsertTrackCheck(tx: Tx, values: { visitId: string; trackId: string; siteId: string; outcome: TrackCheckOutcome }): Promise<void> {
  await tx.insert(trackChecks).values(values).onConflictDoUpdate({ target: [trackChecks.visitId, trackChecks.trackId], set: { outcome: values.outcome } });
}

export async function deleteTrackCheck(tx: Tx, visitId: string, trackId: string): Promise<void> {
  await tx.delete(trackChecks).where(and(eq(trackChecks.visitId, visitId), eq(trackChecks.trackId, trackId)));
}

/** Lesions of a visit kept as new tracks, with who decided and when. */
export function keptNewOfVisit(visitId: string) {
  return db
    .select({ lesionId: keptNewLesions.lesionId, decidedBy: users.displayName, decidedAt: keptNewLesions.decidedAt })
    .from(keptNewLesions)
    .innerJoin(users, eq(users.id, keptNewLesions.decidedBy))
    .where(eq(keptNewLesions.visitId, visitId));
}

export async function insertKeptNew(tx: Tx, values: { lesionId: string; visitId: string; siteId: string; decidedBy: string }): Promise<void> {
  await tx.insert(keptNewLesions).values(values).onConflictDoNothing();
}

export async function deleteKeptNew(tx: Tx, lesionId: string): Promise<void> {
  await tx.delete(keptNewLesions).where(eq(keptNewLesions.lesionId, lesionId));
}
