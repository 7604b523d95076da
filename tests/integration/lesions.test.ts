import { beforeAll, describe, expect, it } from "vitest";
import { count, eq } from "drizzle-orm";
import { db, onQuery, sql } from "@/db/client";
import { auditEvents, lesions, lesionTracks, trackStatuses, visits } from "@/db/schema";
import { GET, POST } from "@/app/api/visits/[visitId]/lesions/route";
import { DELETE, PATCH } from "@/app/api/visits/[visitId]/lesions/[lesionId]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteA: string, siteB: string, patientId: string, visitId: string, signedVisitId: string;
let clinician: Actor, reviewer: Actor, nurse: Actor, other: Actor;

const body = { clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, grade: "hsil" };

async function lesionCount(v: string) {
  const [r] = await db.select({ n: count() }).from(lesions).where(eq(lesions.visitId, v));
  return r!.n;
}

beforeAll(async () => {
  siteA = (await makeSite()).id;
  siteB = (await makeSite()).id;
  clinician = await actor("clinician", [siteA]);
  reviewer = await actor("reviewer", [siteA]);
  nurse = await actor("research_nurse", [siteA]);
  other = await actor("clinician", [siteB]);
  patientId = (await makePatient(siteA)).id;
  const [v] = await db.insert(visits).values({ patientId, siteId: siteA, visitDate: "2026-03-01", examinerId: clinician.userId }).returning();
  visitId = v!.id;
  const [s] = await db.insert(visits).values({ patientId, siteId: siteA, visitDate: "2025-09-01", examinerId: clinician.userId, status: "signed", signedAt: new Date() }).returning();
  signedVisitId = s!.id;
});

describe("lesions route", () => {
  it("creates a lesion in the stored frame, with a zone, a label and a new track, without a status while the visit is a draft", async () => {
    const res = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, body), ctx({ visitId }));
    expect(res.status).toBe(201);
    const { lesion } = await res.json();
    expect(lesion).toMatchObject({ clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, grade: "hsil", label: "L1", version: 1 });
    // 1.5 cm from the verge is at the dentate line (1–2 cm above the verge, HPO HP:0030440),
    // inside the transformation zone around it (Fenger; Sleisenger & Fordtran).
    expect(lesion.zone).toBe("transformation_zone");
    // Statuses come from signed visits only: a draft finds nothing yet.
    const statuses = await db.select().from(trackStatuses).where(eq(trackStatuses.trackId, lesion.trackId));
    expect(statuses).toEqual([]);
  });

  it("places a perianal lesion outside the verge in the perianal zone (AJCC 8th: within 5 cm of the verge)", async () => {
    const res = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, { ...body, distanceStartCm: -3, distanceEndCm: -2 }), ctx({ visitId }));
    expect((await res.json()).lesion.zone).toBe("perianal");
  });

  it("keeps an arc across 12 o'clock as given (11 to 1)", async () => {
    const res = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, { ...body, clockStartH: 11, clockEndH: 1 }), ctx({ visitId }));
    const { lesion } = await res.json();
    expect([lesion.clockStartH, lesion.clockEndH]).toEqual([11, 1]);
  });

  it("updates with the current version and answers 409 to a stale version", async () => {
    const { lesion } = await (await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, body), ctx({ visitId }))).json();
    const ok = await PATCH(req("PATCH", "/x", clinician, { version: 1, grade: "lsil" }), ctx({ visitId, lesionId: lesion.id }));
    expect(ok.status).toBe(200);
    expect((await ok.json()).lesion).toMatchObject({ grade: "lsil", version: 2 });
    const stale = await PATCH(req("PATCH", "/x", clinician, { version: 1, grade: "condyloma" }), ctx({ visitId, lesionId: lesion.id }));
    expect(stale.status).toBe(409);
    const [row] = await db.select().from(lesions).where(eq(lesions.id, lesion.id));
    expect(row!.grade).toBe("lsil");
  });

  it("does no status work for a lesion written on a draft, whatever changes, and leaves the signed visits' statuses as they were", async () => {
    // An earlier, signed exam found LSIL on track T; today's lesion starts on a track of its own.
    // Statuses come from signed visits only (a draft neither clears nor finds anything), so no
    // write on the draft, not even a grade change or a link to T, sends a status statement.
    const [t] = await db.insert(lesionTracks).values({ patientId, siteId: siteA, label: "T90" }).returning();
    await db.insert(lesions).values({ visitId: signedVisitId, siteId: siteA, trackId: t!.id, label: "L90", clockStartH: 7, clockEndH: 8, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: "lsil" });
    await db.insert(trackStatuses).values({ trackId: t!.id, visitId: signedVisitId, siteId: siteA, status: "new", effectiveGrade: "lsil", reason: "first sighting" });
    const statusStatements = async (send: () => Promise<Response>, expected: number) => {
      const statements: string[] = [];
      const stop = onQuery((q) => statements.push(q));
      const res = await send();
      stop();
      expect(res.status).toBe(expected);
      return statements.filter((q) => q.includes("track_statuses")).length;
    };
    let made: { id: string } | undefined;
    expect(
      await statusStatements(async () => {
        const res = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, { ...body, clockStartH: 7, clockEndH: 8 }), ctx({ visitId }));
        made = (await res.clone().json()).lesion;
        return res;
      }, 201),
    ).toBe(0);
    const patch = (changes: Record<string, unknown>, version: number) =>
      statusStatements(() => PATCH(req("PATCH", "/x", clinician, { version, ...changes }), ctx({ visitId, lesionId: made!.id })), 200);
    const statusesOfT = async () => (await db.select().from(trackStatuses).where(eq(trackStatuses.trackId, t!.id))).map((r) => [r.visitId, r.status]);
    expect(await patch({ trackId: t!.id, grade: "hsil" }, 1)).toBe(0);
    expect(await patch({ grade: "lsil" }, 2)).toBe(0);
    expect(await patch({ clockStartH: 7.5, clockEndH: 8.5, note: "Flat, sharp border." }, 3)).toBe(0);
    expect(await statusStatements(() => DELETE(req("DELETE", "/x?version=4", clinician), ctx({ visitId, lesionId: made!.id })), 200)).toBe(0);
    expect(await statusesOfT()).toEqual([[signedVisitId, "new"]]);
  });

  it("deletes with the current version only", async () => {
    const { lesion } = await (await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, body), ctx({ visitId }))).json();
    expect((await DELETE(req("DELETE", `/x?version=9`, clinician), ctx({ visitId, lesionId: lesion.id }))).status).toBe(409);
    expect((await DELETE(req("DELETE", `/x?version=1`, clinician), ctx({ visitId, lesionId: lesion.id }))).status).toBe(200);
    expect(await db.select().from(lesions).where(eq(lesions.id, lesion.id))).toHaveLength(0);
  });

  it("makes a create sent twice with one client key once: the retry gets the same lesion, one track, one audit", async () => {
    // A retry after a lost answer (common practice for safe retries of a POST, no source).
    const clientKey = "7d0e9f52-3c1a-4b6e-9a2f-0c8d1e4b5a67";
    const before = await lesionCount(visitId);
    const [{ n: tracksBefore }] = await db.select({ n: count() }).from(lesionTracks).where(eq(lesionTracks.patientId, patientId));
    const first = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, { ...body, clientKey }), ctx({ visitId }));
    const again = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, { ...body, clockStartH: 5, clockEndH: 6, clientKey }), ctx({ visitId }));
    expect(first.status).toBe(201);
    expect(again.status).toBe(201);
    const a = (await first.json()).lesion;
    const b = (await again.json()).lesion;
    expect(b.id).toBe(a.id);
    // The lesion as first made: the second body is not applied over it.
    expect(b).toMatchObject({ clockStartH: 1, clockEndH: 3, label: a.label, version: 1 });
    expect(await lesionCount(visitId)).toBe(before + 1);
    const [{ n: tracksAfter }] = await db.select({ n: count() }).from(lesionTracks).where(eq(lesionTracks.patientId, patientId));
    expect(tracksAfter).toBe(tracksBefore + 1);
    const audits = await db.select().from(auditEvents).where(eq(auditEvents.entityId, a.id));
    expect(audits.filter((e) => e.action === "lesion.create")).toHaveLength(1);
    // Another key makes another lesion.
    const other = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, { ...body, clientKey: "0b6f3a2e-8d4c-4f1a-b7e9-5c2d1a0f9e83" }), ctx({ visitId }));
    expect(other.status).toBe(201);
    expect((await other.json()).lesion.id).not.toBe(a.id);
  });

  it("makes a create sent twice at the same moment with one client key once: both answers name the same lesion", async () => {
    // The retry can overtake the first attempt's answer (common practice for safe retries of a POST,
    // no source). The second request waits on the visit lock, then looks the key up afresh.
    const clientKey = "3f1c2b8e-6a4d-4e7f-9b2a-1d5c8e0f7a46";
    const before = await lesionCount(visitId);
    const send = () => POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, { ...body, clientKey }), ctx({ visitId }));
    // Another transaction holds the visit row, so both requests are surely in flight together:
    // each waits on the lock, then they take it in turn.
    const holder = await sql.reserve();
    await holder`begin`;
    await holder`select 1 from visits where id = ${visitId} for update`;
    const sent = Promise.all([send(), send()]);
    const waiting = async () => (await sql<{ n: number }[]>`select count(*)::int as n from pg_stat_activity where datname = current_database() and wait_event_type = 'Lock'`)[0]!.n;
    for (let i = 0; i < 100 && (await waiting()) < 2; i++) await new Promise((r) => setTimeout(r, 50));
    await holder`commit`;
    holder.release();
    const [first, again] = await sent;
    expect([first.status, again.status]).toEqual([201, 201]);
    const [a, b] = [(await first.json()).lesion, (await again.json()).lesion];
    expect(b.id).toBe(a.id);
    expect(await lesionCount(visitId)).toBe(before + 1);
    const audits = await db.select().from(auditEvents).where(eq(auditEvents.entityId, a.id));
    expect(audits.filter((e) => e.action === "lesion.create")).toHaveLength(1);
  });

  it("answers 400 with field messages for bad input and writes nothing", async () => {
    const before = await lesionCount(visitId);
    for (const bad of [
      { ...body, clockStartH: 12 },
      { ...body, clockStartH: "3" },
      { ...body, distanceStartCm: 3, distanceEndCm: 1 },
      { ...body, grade: "AIN9" },
      { ...body, distanceStartCm: -9 },
      { ...body, clientKey: "not-a-uuid" },
      {},
    ]) {
      const res = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, bad), ctx({ visitId }));
      expect(res.status).toBe(400);
      expect(Object.keys((await res.json()).error.fields ?? {}).length).toBeGreaterThan(0);
    }
    expect(await lesionCount(visitId)).toBe(before);
  });

  it("lets reviewers read but not write (403); the research nurse may not read a visit's identified map (403)", async () => {
    expect((await GET(req("GET", "/x", reviewer), ctx({ visitId }))).status).toBe(200);
    // The research nurse's role is de-identified study data only.
    expect((await GET(req("GET", "/x", nurse), ctx({ visitId }))).status).toBe(403);
    expect((await POST(req("POST", "/x", reviewer, body), ctx({ visitId }))).status).toBe(403);
    expect((await POST(req("POST", "/x", nurse, body), ctx({ visitId }))).status).toBe(403);
  });

  it("hides another site's visit (404) on read and write", async () => {
    const before = await lesionCount(visitId);
    expect((await GET(req("GET", "/x", other), ctx({ visitId }))).status).toBe(404);
    expect((await POST(req("POST", "/x", other, body), ctx({ visitId }))).status).toBe(404);
    expect(await lesionCount(visitId)).toBe(before);
  });

  it("refuses changes to a signed visit with 423 and says so; the map reads as read-only", async () => {
    const res = await POST(req("POST", "/x", clinician, body), ctx({ visitId: signedVisitId }));
    expect(res.status).toBe(423);
    expect((await res.json()).error.message).toMatch(/signed/i);
    const map = await (await GET(req("GET", "/x", clinician), ctx({ visitId: signedVisitId }))).json();
    expect(map.visit.readOnly).toBe(true);
  });
});
