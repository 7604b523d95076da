import "server-only";
// Re-finding earlier lesions at a later visit: what to look for, suggested links, and the
// clinician's decisions (link, split, merge, not found), each audited.
import { db } from "@/db/client";
import {
  biopsyResultsOfLesions, deleteKeptNew, deleteTrackCheck, insertKeptNew, keptNewOfVisit, dropTrackIfEmpty, earlierSightings, insertNextTrack, lesionOfTrackOnVisit, lesionPlacesOfVisit, lesionTrackOnVisit, lockPatientRow,
  moveTrack, setLesionTrack, sightingsOfTracks, trackChecksOfVisit, trackIsPatients, upsertTrackCheck,
} from "@/db/queries/track-links";
import { loadVisit, lockDraftVisit } from "@/db/queries/visit-access";
import { lockPatientStatusesOfVisit } from "@/db/queries/patient-lock";
import { recordAudit } from "@/db/queries/audit-write";
import type { SiteScope } from "@/db/queries/scope";
import { AppError } from "@/lib/errors";
import { matchLesionsToTracks, undecidedTracks } from "@/lib/tracking";
import { lesionGrades } from "@/lib/tracking/effective-grade";
import type { TrackAction } from "@/lib/validation/tracking";
import { refreshTrackStatuses } from "./track-statuses";

/**
 * For a follow-up visit: the last sighting of every earlier track (drawn as faint outlines),
 * what was marked at this visit, and suggested links for lesions drawn fresh here.
 */
/** loadFollowUpContext for a GET: the read audited as a read of the visit (`visit.tracks.read`). */
export async function readFollowUpContext(scope: SiteScope, visitId: string, ip: string) {
  const [visit, context] = await Promise.all([loadVisit(db, scope, visitId), loadFollowUpContext(scope, visitId)]);
  await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: "visit.tracks.read", entityType: "visit", entityId: visit.id, ip });
  return context;
}

export async function loadFollowUpContext(scope: SiteScope, visitId: string) {
  const visit = await loadVisit(db, scope, visitId);
  const earlier = await earlierSightings(visit.patientId, visit.visitDate);
  const ghosts = new Map<string, (typeof earlier)[number]>();
  for (const l of earlier) if (l.trackId && !ghosts.has(l.trackId)) ghosts.set(l.trackId, l);
  const lastSeen = [...ghosts.values()];
  const [here, checks, kept, results] = await Promise.all([
    lesionPlacesOfVisit(visit.id),
    trackChecksOfVisit(visit.id),
    keptNewOfVisit(visit.id),
    lastSeen.length ? biopsyResultsOfLesions(lastSeen.map((g) => g.lesionId)) : [],
  ]);
  // Shown as the timeline and compare screens show it: histology decides over the impression.
  const grades = lesionGrades(lastSeen.map((g) => ({ id: g.lesionId, grade: g.grade })), results);

  const foundTracks = new Set(here.map((l) => l.trackId));
  // Lesions drawn fresh: their track has no sighting before this visit. One kept as new is decided.
  const keptIds = new Set(kept.map((k) => k.lesionId));
  const fresh = here.filter((l) => (!l.trackId || !ghosts.has(l.trackId)) && !keptIds.has(l.id));
  // Still to look for: the same rule signing applies (lib/tracking/undecided.ts).
  const open = undecidedTracks([...ghosts.values()].map((g) => ({ ...g, trackId: g.trackId!, label: g.trackLabel })), foundTracks, checks);
  const suggestion = matchLesionsToTracks(
    open.map((g) => ({ trackId: g.trackId!, label: g.trackLabel, startH: g.clockStartH, endH: g.clockEndH, distStartCm: g.distanceStartCm, distEndCm: g.distanceEndCm, zone: g.zone })),
    fresh.map((l) => ({ lesionId: l.id, startH: l.clockStartH, endH: l.clockEndH, distStartCm: l.distanceStartCm, distEndCm: l.distanceEndCm, zone: l.zone })),
  );
  return {
    visit: { id: visit.id, status: visit.status, visitDate: visit.visitDate },
    ghosts: lastSeen.map(({ grade: impression, ...g }) => ({ ...g, impression, histology: grades.get(g.lesionId)!.histology, grade: grades.get(g.lesionId)!.effectiveGrade, foundHere: foundTracks.has(g.trackId), checkHere: checks.find((c) => c.trackId === g.trackId)?.outcome ?? null })),
    suggestions: suggestion.matches,
    unmatchedLesionIds: suggestion.unmatchedLesionIds,
    keptNew: kept.filter((k) => here.some((l) => l.id === k.lesionId && (!l.trackId || !ghosts.has(l.trackId)))).map((k) => ({ ...k, decidedAt: k.decidedAt.toISOString() })),
  };
}

/** Confirm, relink, split or merge tracks, mark an earlier track not found, or keep a fresh lesion as new; every change audited. */
export async function applyTrackAction(scope: SiteScope, visitId: string, action: TrackAction, ip: string) {
  return db.transaction(async (tx) => {
    const [, visit] = await Promise.all([lockPatientStatusesOfVisit(tx, scope, visitId), lockDraftVisit(tx, scope, visitId)]);
    await lockPatientRow(tx, visit.patientId);
    const trackOfPatient = async (trackId: string) => {
      if (!(await trackIsPatients(tx, trackId, visit.patientId))) throw new AppError("invalid", undefined, { trackId: ["That track does not belong to this patient."] });
    };
    const lesionHere = async (lesionId: string) => {
      const l = await lesionTrackOnVisit(tx, lesionId, visit.id);
      if (!l) throw new AppError("invalid", undefined, { lesionId: ["That lesion is not on this visit."] });
      return l;
    };
    switch (action.action) {
      case "link": {
        const l = await lesionHere(action.lesionId);
        await trackOfPatient(action.trackId);
        const clash = await lesionOfTrackOnVisit(tx, action.trackId, visit.id);
        if (clash && clash.id !== l.id) throw new AppError("conflict", "Another lesion of this visit already continues that track. Split it first.");
        await setLesionTrack(tx, l.id, action.trackId);
        await deleteTrackCheck(tx, visit.id, action.trackId);
        await deleteKeptNew(tx, l.id);
        await dropTrackIfEmpty(tx, l.trackId);
        break;
      }
      case "split": {
        const l = await lesionHere(action.lesionId);
        await setLesionTrack(tx, l.id, await insertNextTrack(tx, visit.patientId, visit.siteId));
        break;
      }
      case "merge": {
        if (action.trackId === action.intoTrackId) throw new AppError("invalid", undefined, { intoTrackId: ["A track cannot be merged into itself."] });
        await trackOfPatient(action.trackId);
        await trackOfPatient(action.intoTrackId);
        const seen = new Map<string, Set<string>>();
        for (const r of await sightingsOfTracks(tx, [action.trackId, action.intoTrackId])) seen.set(r.visitId, (seen.get(r.visitId) ?? new Set()).add(r.trackId!));
        if ([...seen.values()].some((s) => s.size > 1)) throw new AppError("conflict", "Both tracks have a lesion at the same visit; they are different lesions.");
        await moveTrack(tx, action.trackId, action.intoTrackId);
        await dropTrackIfEmpty(tx, action.trackId);
        break;
      }
      case "check": {
        await trackOfPatient(action.trackId);
        if (await lesionOfTrackOnVisit(tx, action.trackId, visit.id)) throw new AppError("conflict", "That track has a lesion on this visit; it was found.");
        await upsertTrackCheck(tx, { visitId: visit.id, trackId: action.trackId, siteId: visit.siteId, outcome: action.outcome });
        break;
      }
      case "uncheck":
        await deleteTrackCheck(tx, visit.id, action.trackId);
        break;
      case "keep_new":
        await lesionHere(action.lesionId);
        await insertKeptNew(tx, { lesionId: action.lesionId, visitId: visit.id, siteId: visit.siteId, decidedBy: scope.userId });
        break;
      case "unkeep_new":
        await lesionHere(action.lesionId);
        await deleteKeptNew(tx, action.lesionId);
        break;
    }
    // Keeping a lesion as new changes no track, so no status.
    if (action.action !== "keep_new" && action.action !== "unkeep_new") await refreshTrackStatuses(tx, visit.patientId, visit.siteId);
    await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: `track.${action.action}`, entityType: "visit", entityId: visit.id, ip, detail: { ...action } }, tx);
    return { ok: true };
  });
}
