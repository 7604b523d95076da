import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, onQuery } from "@/db/client";
import { lesions, lesionTracks, trackStatuses, treatments, visits } from "@/db/schema";
import { refreshTrackStatuses } from "@/lib/server/track-statuses";
import { POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { GET as followUp, POST as trackAction } from "@/app/api/visits/[visitId]/tracks/route";
import { GET as timeline } from "@/app/api/patients/[patientId]/timeline/route";
import { decodeTimeline } from "@/lib/timeline/wire";
import type { Timeline } from "@/lib/api/types";
import { GET as patientReviews, POST as requestReview } from "@/app/api/patients/[patientId]/reviews/route";
import { PUT as adjudicate } from "@/app/api/reviews/[reviewId]/adjudications/route";
import { POST as signOff } from "@/app/api/reviews/[reviewId]/sign-off/route";
import { POST as signVisit } from "@/app/api/visits/[visitId]/sign/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string;
let clinician: Actor, reviewer: Actor, nurse: Actor;

beforeAll(async () => {
  siteId = (await makeSite()).id;
  clinician = await actor("clinician", [siteId]);
  reviewer = await actor("reviewer", [siteId]);
  nurse = await actor("research_nurse", [siteId]);
});

async function visit(patientId: string, date: string, status: "draft" | "signed" = "draft") {
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: date, examinerId: clinician.userId, status }).returning();
  return v!.id;
}

const L = (startH: number, endH: number, d0: number, d1: number, grade = "hsil") => ({ clockStartH: startH, clockEndH: endH, distanceStartCm: d0, distanceEndCm: d1, grade });

describe("follow-up: re-finding earlier lesions", () => {
  it("shows earlier tracks, suggests links with reasons, and links/marks them with statuses to match", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await visit(patientId, "2025-01-10");
    const a = (await (await createLesion(req("POST", "/x", clinician, L(11.5, 0.5, 1, 2)), ctx({ visitId: v1 }))).json()).lesion;
    const b = (await (await createLesion(req("POST", "/x", clinician, L(5, 6, 0.5, 1.5, "lsil")), ctx({ visitId: v1 }))).json()).lesion;
    const c = (await (await createLesion(req("POST", "/x", clinician, L(8, 9, -2, -1, "condyloma")), ctx({ visitId: v1 }))).json()).lesion;
    await db.update(visits).set({ status: "signed" }).where(eq(visits.id, v1));

    const v2 = await visit(patientId, "2025-07-10");
    // Drawn fresh: a twin of `a` across 12 o'clock, a twin of `b` now HSIL, and a new one far away.
    const a2 = (await (await createLesion(req("POST", "/x", clinician, L(11.4, 0.6, 1, 2)), ctx({ visitId: v2 }))).json()).lesion;
    const b2 = (await (await createLesion(req("POST", "/x", clinician, L(5, 6.5, 0.5, 1.5)), ctx({ visitId: v2 }))).json()).lesion;
    const n2 = (await (await createLesion(req("POST", "/x", clinician, L(2, 3, 3, 4)), ctx({ visitId: v2 }))).json()).lesion;

    const ctxRes = await (await followUp(req("GET", "/x", clinician), ctx({ visitId: v2 }))).json();
    expect(ctxRes.ghosts.map((g: { trackId: string }) => g.trackId).sort()).toEqual([a.trackId, b.trackId, c.trackId].sort());
    const byLesion = Object.fromEntries(ctxRes.suggestions.map((s: { lesionId: string; trackId: string }) => [s.lesionId, s.trackId]));
    expect(byLesion[a2.id]).toBe(a.trackId);
    expect(byLesion[b2.id]).toBe(b.trackId);
    expect(byLesion[n2.id]).toBeUndefined();
    expect(ctxRes.suggestions[0].explanation).toMatch(/overlaps/);

    // Accept the suggestions and mark the third earlier track not found.
    for (const s of ctxRes.suggestions) {
      const r = await trackAction(req("POST", "/x", clinician, { action: "link", lesionId: s.lesionId, trackId: s.trackId }), ctx({ visitId: v2 }));
      expect(r.status).toBe(200);
    }
    expect((await trackAction(req("POST", "/x", clinician, { action: "check", trackId: c.trackId, outcome: "not_found" }), ctx({ visitId: v2 }))).status).toBe(200);
    // Statuses come from signed visits: none at the draft, then every earlier track decided, it signs.
    expect(await db.select().from(trackStatuses).where(eq(trackStatuses.visitId, v2))).toEqual([]);
    expect((await signVisit(req("POST", "/x", clinician), ctx({ visitId: v2 }))).status).toBe(200);

    const statuses = await db.select().from(trackStatuses).where(eq(trackStatuses.visitId, v2));
    const statusOf = (trackId: string) => statuses.find((s) => s.trackId === trackId)?.status;
    // Liu 2018 / LAST grades: same grade = persistent; LSIL to HSIL = progressed; untreated, not found = regressed.
    expect(statusOf(a.trackId)).toBe("persistent");
    expect(statusOf(b.trackId)).toBe("progressed");
    expect(statusOf(c.trackId)).toBe("regressed");
    expect(statusOf(n2.trackId)).toBe("new");
    // The orphan tracks of the relinked lesions are gone.
    expect(await db.select().from(lesionTracks).where(eq(lesionTracks.id, a2.trackId))).toHaveLength(0);
  });

  it("refuses to link two lesions of one visit to the same track, and a nurse cannot relink", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await visit(patientId, "2025-01-10");
    const a = (await (await createLesion(req("POST", "/x", clinician, L(1, 2, 1, 2)), ctx({ visitId: v1 }))).json()).lesion;
    await db.update(visits).set({ status: "signed" }).where(eq(visits.id, v1));
    const v2 = await visit(patientId, "2025-06-10");
    const x = (await (await createLesion(req("POST", "/x", clinician, L(1, 2, 1, 2)), ctx({ visitId: v2 }))).json()).lesion;
    const y = (await (await createLesion(req("POST", "/x", clinician, L(1.5, 2.5, 1, 2)), ctx({ visitId: v2 }))).json()).lesion;
    expect((await trackAction(req("POST", "/x", clinician, { action: "link", lesionId: x.id, trackId: a.trackId }), ctx({ visitId: v2 }))).status).toBe(200);
    expect((await trackAction(req("POST", "/x", clinician, { action: "link", lesionId: y.id, trackId: a.trackId }), ctx({ visitId: v2 }))).status).toBe(409);
    expect((await trackAction(req("POST", "/x", nurse, { action: "split", lesionId: x.id }), ctx({ visitId: v2 }))).status).toBe(403);
    expect((await trackAction(req("POST", "/x", clinician, { action: "teleport" }), ctx({ visitId: v2 }))).status).toBe(400);
  });
});

describe("timeline", () => {
  it("loads a patient with 30 visits × 40 lesions in a fixed number of SQL queries", async () => {
    const patientId = (await makePatient(siteId)).id;
    const tracks = await db.insert(lesionTracks).values(Array.from({ length: 40 }, (_, i) => ({ patientId, siteId, label: `T${i + 1}` }))).returning();
    const vs = await db.insert(visits).values(Array.from({ length: 30 }, (_, i) => ({ patientId, siteId, visitDate: `20${String(10 + Math.floor(i / 4)).padStart(2, "0")}-${String((i % 4) * 3 + 1).padStart(2, "0")}-15`, examinerId: clinician.userId, status: "signed" as const }))).returning();
    await db.insert(lesions).values(vs.flatMap((v) => tracks.map((t, i) => ({ visitId: v.id, siteId, trackId: t.id, label: `L${i + 1}`, clockStartH: (i * 0.3) % 12, clockEndH: (i * 0.3 + 0.5) % 12, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone" as const, grade: "lsil" as const }))));
    await db.insert(treatments).values({ visitId: vs[3]!.id, siteId, modality: "electrocautery", arcs: [{ startH: 11, endH: 1 }], treatedFraction: 2 / 12 });
    await refreshTrackStatuses(db, patientId, siteId);

    let queries = 0;
    const seen: string[] = [];
    // postgres.js asks pg_catalog for array types once per new pool connection: not per request.
    const stop = onQuery((q) => {
      if (q.includes("pg_catalog.pg_type")) return;
      queries++;
      seen.push(q.slice(0, 90));
    });
    const res = await timeline(req("GET", "/x", clinician), ctx({ patientId }));
    stop();
    expect(res.status).toBe(200);
    const text = await res.text();
    // Each lesion once, in columns with repeated words as indices (lib/timeline/wire): the whole
    // answer for 1,200 lesions and 1,200 statuses stays under 150 KB before gzip (it was ~770 KB).
    expect(text.length).toBeLessThan(150_000);
    const body = decodeTimeline<Timeline>(JSON.parse(text));
    expect(body.visits).toHaveLength(30);
    expect(body.lesions).toHaveLength(1200);
    expect(body.statuses).toHaveLength(1200);
    // Session check (1) + patient + 9 parallel reads + audit insert; never one per visit or lesion.
    expect(queries, seen.join("\n")).toBeLessThanOrEqual(14);
    // 11 o'clock to 1 o'clock is 2 hours of 12 (30° per hour): one sixth of the circumference.
    expect(body.perVisit[3]!.treatedFraction).toBeCloseTo(2 / 12, 6);
    // Oldest first: time reads left to right.
    expect(body.visits[0].visitDate < body.visits[29].visitDate).toBe(true);
  });
});

describe("review and adjudication", () => {
  it("a reviewer disagrees with a status and comments; the clinician sees the open disagreement", async () => {
    const patientId = (await makePatient(siteId)).id;
    const v1 = await visit(patientId, "2025-02-01");
    const a = (await (await createLesion(req("POST", "/x", clinician, L(3, 4, 1, 2)), ctx({ visitId: v1 }))).json()).lesion;
    const r = await requestReview(req("POST", "/x", clinician, { visitId: v1, reviewerId: reviewer.userId }), ctx({ patientId }));
    expect(r.status).toBe(201);
    const { review } = await r.json();
    const bad = await adjudicate(req("PUT", "/x", reviewer, { trackId: a.trackId, verdict: "disagree" }), ctx({ reviewId: review.id }));
    expect(bad.status).toBe(400);
    expect((await adjudicate(req("PUT", "/x", clinician, { trackId: a.trackId, verdict: "agree" }), ctx({ reviewId: review.id }))).status).toBe(403);
    const ok = await adjudicate(req("PUT", "/x", reviewer, { trackId: a.trackId, verdict: "disagree", proposedStatus: "persistent", comment: "Same site as the 2024 lesion." }), ctx({ reviewId: review.id }));
    expect(ok.status).toBe(200);
    expect((await signOff(req("POST", "/x", reviewer), ctx({ reviewId: review.id }))).status).toBe(200);
    expect((await adjudicate(req("PUT", "/x", reviewer, { trackId: a.trackId, verdict: "agree" }), ctx({ reviewId: review.id }))).status).toBe(423);
    const open = await (await patientReviews(req("GET", "/x", clinician), ctx({ patientId }))).json();
    expect(open.openDisagreements).toHaveLength(1);
    expect(open.openDisagreements[0]).toMatchObject({ proposedStatus: "persistent", comment: "Same site as the 2024 lesion." });
  });
});
