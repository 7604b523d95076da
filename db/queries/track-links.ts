import "server-only";
import { and, asc, desc, eq, inArray, lt, sql as dsql } from "drizzle-orm";
import { db } from "../client";
import { lesions, lesionTracks, trackChecks, visits } from "../schema";
import type { SiteScope } from "./scope";
import { loadVisit, lockDraftVisit } from "./visit-access";
import { refreshTrackStatuses } from "./tracking";
import { recordAudit } from "./audit-write";
import { AppError } from "@/lib/errors";
import { matchLesionsToTracks } from "@/lib/tracking";
import type { TrackAction } from "@/lib/validation/tracking";

/**
 * For a follow-up visit: the last sighting of every earlier track (drawn as faint outlines),
 * what was marked at this visit, and suggested links for lesions drawn fresh here.
 */
export async function loadFollowUpContext(scope: SiteScope, visitId: string) {
  const visit = await loadVisit(db, scope, visitId);
  const earlier = await db
    .select({
      lesionId: lesions.id, trackId: lesions.trackId, trackLabel: lesionTracks.label, visitDate: visits.visitDate, label: lesions.label,
      clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH, distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm,
      zone: lesions.zone, grade: lesions.grade,
    })
    .from(lesions)
    .innerJoin(visits, eq(visits.id, lesions.visitId))
    .innerJoin(lesionTracks, eq(lesionTracks.id, lesions.trackId))
    .where(and(eq(visits.patientId, visit.patientId), lt(visits.visitDate, visit.visitDate)))
    .orderBy(desc(visits.visitDate));
  const ghosts = new Map<string, (typeof earlier)[number]>();
  for (const l of earlier) if (l.trackId && !ghosts.has(l.trackId)) ghosts.set(l.trackId, l);

  const here = await db
    .select({ id: lesions.id, trackId: lesions.trackId, label: lesions.label, clockStartH: lesions.clockStartH, clockEndH: lesions.clockEndH, distanceStartCm: lesions.distanceStartCm, distanceEndCm: lesions.distanceEndCm, zone: lesions.zone })
    .from(lesions)
    .where(eq(lesions.visitId, visit.id))
    .orderBy(asc(lesions.label));
  const checks = await db.select({ trackId: trackChecks.trackId, outcome: trackChecks.outcome }).from(trackChecks).where(eq(trackChecks.visitId, visit.id));

  const foundTracks = new Set(here.map((l) => l.trackId));
  const checkedTracks = new Set(checks.map((c) => c.trackId));
  // Lesions drawn fresh: their track has no sighting before this visit.
  const fresh = here.filter((l) => !l.trackId || !ghosts.has(l.trackId));
  const open = [...ghosts.values()].filter((g) => !foundTracks.has(g.trackId) && !checkedTracks.has(g.trackId!));
  const suggestion = matchLesionsToTracks(
    open.map((g) => ({ trackId: g.trackId!, label: g.trackLabel, startH: g.clockStartH, endH: g.clockEndH, distStartCm: g.distanceStartCm, distEndCm: g.distanceEndCm, zone: g.zone })),
    fresh.map((l) => ({ lesionId: l.id, startH: l.clockStartH, endH: l.clockEndH, distStartCm: l.distanceStartCm, distEndCm: l.distanceEndCm, zone: l.zone })),
  );
  return {
    visit: { id: visit.id, status: visit.status, visitDate: visit.visitDate },
    ghosts: [...ghosts.values()].map((g) => ({ ...g, foundHere: foundTracks.has(g.trackId), checkHere: checks.find((c) => c.trackId === g.trackId)?.outcome ?? null })),
    suggestions: suggestion.matches,
    unmatchedLesionIds: suggestion.unmatchedLesionIds,
  };
}

/** Confirm, relink, split or merge tracks, or mark an earlier track not found; every change audited. */
export async function applyTrackAction(scope: SiteScope, visitId: string, action: TrackAction, ip: string) {
  return db.transaction(async (tx) => {
    const visit = await lockDraftVisit(tx, scope, visitId);
    await tx.execute(dsql`select id from patients where id = ${visit.patientId} for update`);
    const trackOfPatient = async (trackId: string) => {
      const [t] = await tx.select({ id: lesionTracks.id }).from(lesionTracks).where(and(eq(lesionTracks.id, trackId), eq(lesionTracks.patientId, visit.patientId)));
      if (!t) throw new AppError("invalid", undefined, { trackId: ["That track does not belong to this patient."] });
    };
    const lesionHere = async (lesionId: string) => {
      const [l] = await tx.select({ id: lesions.id, trackId: lesions.trackId }).from(lesions).where(and(eq(lesions.id, lesionId), eq(lesions.visitId, visit.id)));
      if (!l) throw new AppError("invalid", undefined, { lesionId: ["That lesion is not on this visit."] });
      return l;
    };
    const dropIfEmpty = async (trackId: string | null) => {
      if (!trackId) return;
      await tx.execute(dsql`delete from lesion_tracks t where t.id = ${trackId}
        and not exists (select 1 from lesions where track_id = t.id)
        and not exists (select 1 from track_checks where track_id = t.id)
        and not exists (select 1 from adjudications where track_id = t.id)`);
    };
    switch (action.action) {
      case "link": {
        const l = await lesionHere(action.lesionId);
        await trackOfPatient(action.trackId);
        const [clash] = await tx.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.visitId, visit.id), eq(lesions.trackId, action.trackId)));
        if (clash && clash.id !== l.id) throw new AppError("conflict", "Another lesion of this visit already continues that track. Split it first.");
        await tx.update(lesions).set({ trackId: action.trackId, version: dsql`${lesions.version} + 1` }).where(eq(lesions.id, l.id));
        await tx.delete(trackChecks).where(and(eq(trackChecks.visitId, visit.id), eq(trackChecks.trackId, action.trackId)));
        await dropIfEmpty(l.trackId);
        break;
      }
      case "split": {
        const l = await lesionHere(action.lesionId);
        const rows = (await tx.execute(dsql`select max(substring(label from 2)::int) as m from lesion_tracks where patient_id = ${visit.patientId} and label ~ '^T[0-9]+$'`)) as unknown as { m: number | null }[];
        const [t] = await tx.insert(lesionTracks).values({ patientId: visit.patientId, siteId: visit.siteId, label: `T${(rows[0]?.m ?? 0) + 1}` }).returning({ id: lesionTracks.id });
        await tx.update(lesions).set({ trackId: t!.id, version: dsql`${lesions.version} + 1` }).where(eq(lesions.id, l.id));
        break;
      }
      case "merge": {
        if (action.trackId === action.intoTrackId) throw new AppError("invalid", undefined, { intoTrackId: ["A track cannot be merged into itself."] });
        await trackOfPatient(action.trackId);
        await trackOfPatient(action.intoTrackId);
        const both = await tx.select({ visitId: lesions.visitId, trackId: lesions.trackId }).from(lesions).where(inArray(lesions.trackId, [action.trackId, action.intoTrackId]));
        const seen = new Map<string, Set<string>>();
        for (const r of both) seen.set(r.visitId, (seen.get(r.visitId) ?? new Set()).add(r.trackId!));
        if ([...seen.values()].some((s) => s.size > 1)) throw new AppError("conflict", "Both tracks have a lesion at the same visit; they are different lesions.");
        await tx.update(lesions).set({ trackId: action.intoTrackId }).where(eq(lesions.trackId, action.trackId));
        await tx.execute(dsql`update track_checks set track_id = ${action.intoTrackId} where track_id = ${action.trackId}
          and visit_id not in (select visit_id from track_checks where track_id = ${action.intoTrackId})`);
        await tx.delete(trackChecks).where(eq(trackChecks.trackId, action.trackId));
        await dropIfEmpty(action.trackId);
        break;
      }
      case "check": {
        await trackOfPatient(action.trackId);
        const [found] = await tx.select({ id: lesions.id }).from(lesions).where(and(eq(lesions.visitId, visit.id), eq(lesions.trackId, action.trackId)));
        if (found) throw new AppError("conflict", "That track has a lesion on this visit; it was found.");
        await tx.insert(trackChecks).values({ visitId: visit.id, trackId: action.trackId, siteId: visit.siteId, outcome: action.outcome })
          .onConflictDoUpdate({ target: [trackChecks.visitId, trackChecks.trackId], set: { outcome: action.outcome } });
        break;
      }
      case "uncheck":
        await tx.delete(trackChecks).where(and(eq(trackChecks.visitId, visit.id), eq(trackChecks.trackId, action.trackId)));
        break;
    }
    await refreshTrackStatuses(tx, visit.patientId, visit.siteId);
    await recordAudit({ userId: scope.userId, siteId: visit.siteId, patientId: visit.patientId, action: `track.${action.action}`, entityType: "visit", entityId: visit.id, ip, detail: { ...action } }, tx);
    return { ok: true };
  });
}
