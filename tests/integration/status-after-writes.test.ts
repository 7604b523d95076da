// Track statuses kept by the writes themselves. Property: after every write of a random sequence of
// lesion creates, grade changes, relinks and deletes on one patient's drafts, signings and
// histology results, the stored statuses equal a from-scratch recomputation of the whole history
// (derived data never drifts from its inputs: common practice, no source), and no stored status
// sits at a draft. Statuses come from signed visits only: lesion writes on a draft do no status
// work at all (lib/server/lesions.ts), so the sequence must also sign drafts (each earlier track
// marked not found first, as signing asks), after which their lesions count, and enter results,
// which change a signed visit's grades. The patient starts with one signed visit and its statuses.
import { beforeAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { and, eq, inArray } from "drizzle-orm";
import { db } from "@/db/client";
import { biopsies, lesions, lesionTracks, visits } from "@/db/schema";
import { readTrackHistory } from "@/db/queries/tracking";
import { recomputeTrackStatuses, refreshTrackStatuses } from "@/lib/server/track-statuses";
import { GRADES, HISTOLOGY } from "@/lib/domain/vocab";
import { POST } from "@/app/api/visits/[visitId]/lesions/route";
import { DELETE, PATCH } from "@/app/api/visits/[visitId]/lesions/[lesionId]/route";
import { GET as followUp, POST as trackAction } from "@/app/api/visits/[visitId]/tracks/route";
import { POST as sign } from "@/app/api/visits/[visitId]/sign/route";
import { PATCH as enterResult } from "@/app/api/biopsies/[biopsyId]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string, who: Actor;
beforeAll(async () => {
  siteId = (await makeSite("Incremental")).id;
  who = await actor("clinician", [siteId]);
});

const grade = fc.constantFrom(...GRADES);
const op = fc.oneof(
  fc.record({ kind: fc.constant("create" as const), visit: fc.integer({ min: 0, max: 2 }), grade }),
  fc.record({ kind: fc.constant("grade" as const), lesion: fc.integer({ min: 0, max: 5 }), grade }),
  fc.record({ kind: fc.constant("relink" as const), lesion: fc.integer({ min: 0, max: 5 }), track: fc.integer({ min: 0, max: 5 }) }),
  fc.record({ kind: fc.constant("delete" as const), lesion: fc.integer({ min: 0, max: 5 }) }),
  fc.record({ kind: fc.constant("sign" as const), visit: fc.integer({ min: 0, max: 2 }) }),
  fc.record({ kind: fc.constant("result" as const), lesion: fc.integer({ min: 0, max: 5 }), histology: fc.constantFrom(...HISTOLOGY) }),
);

async function newPatient(firstGrade: (typeof GRADES)[number]) {
  const patientId = (await makePatient(siteId)).id;
  const [signed] = await db.insert(visits).values({ patientId, siteId, visitDate: "2023-06-01", examinerId: who.userId, status: "signed", signedAt: new Date() }).returning();
  const [t] = await db.insert(lesionTracks).values({ patientId, siteId, label: "T1" }).returning();
  await db.insert(lesions).values({ visitId: signed!.id, siteId, trackId: t!.id, label: "L1", clockStartH: 6, clockEndH: 7, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: firstGrade });
  // Its statuses as signing leaves them.
  await refreshTrackStatuses(db, patientId, siteId);
  const drafts = await db
    .insert(visits)
    .values(["2024-01-10", "2025-01-10", "2026-01-10"].map((visitDate) => ({ patientId, siteId, visitDate, examinerId: who.userId })))
    .returning({ id: visits.id });
  return { patientId, draftIds: drafts.map((d) => d.id) };
}

type Op = typeof op extends fc.Arbitrary<infer T> ? T : never;

/** Signs one draft (taken out of `draftIds`): every earlier track still to look for marked not found first. */
async function signDraft(draftIds: string[], i: number) {
  if (draftIds.length === 0) return 200;
  const [visitId] = draftIds.splice(i % draftIds.length, 1) as [string];
  const ctxRes = (await (await followUp(req("GET", "/x", who), ctx({ visitId }))).json()) as { ghosts: { trackId: string; foundHere: boolean; checkHere: string | null }[] };
  for (const g of ctxRes.ghosts.filter((x) => !x.foundHere && !x.checkHere)) {
    const r = await trackAction(req("POST", "/x", who, { action: "check", trackId: g.trackId, outcome: "not_found" }), ctx({ visitId }));
    if (r.status !== 200) return r.status;
  }
  return (await sign(req("POST", "/x", who), ctx({ visitId }))).status;
}

/** A histology result on a lesion of a signed visit: a specimen is taken from it first, if it has none. */
async function enterHistology(patientId: string, i: number, histology: (typeof HISTOLOGY)[number]) {
  const signedLesions = await db
    .select({ id: lesions.id, visitId: lesions.visitId })
    .from(lesions)
    .innerJoin(visits, eq(visits.id, lesions.visitId))
    .where(and(eq(visits.patientId, patientId), eq(visits.status, "signed")))
    .orderBy(lesions.createdAt, lesions.id);
  if (signedLesions.length === 0) return 200;
  const l = signedLesions[i % signedLesions.length]!;
  let [b] = await db.select({ id: biopsies.id }).from(biopsies).where(eq(biopsies.lesionId, l.id));
  if (!b) {
    const taken = await db.select({ id: biopsies.id }).from(biopsies).where(eq(biopsies.visitId, l.visitId));
    [b] = await db.insert(biopsies).values({ visitId: l.visitId, siteId, lesionId: l.id, specimenLabel: "ABCDEFGHIJKLMNOPQRSTUVWXYZ"[taken.length]!, clockH: 1, distanceCm: 1.5 }).returning({ id: biopsies.id });
  }
  return (await enterResult(req("PATCH", `/api/biopsies/${b!.id}`, who, { histology }), ctx({ biopsyId: b!.id }))).status;
}

async function apply(o: Op, patientId: string, draftIds: string[], n: number) {
  if (o.kind === "sign") return signDraft(draftIds, o.visit);
  if (o.kind === "result") return enterHistology(patientId, o.lesion, o.histology);
  const live = await db
    .select({ id: lesions.id, visitId: lesions.visitId, version: lesions.version, trackId: lesions.trackId })
    .from(lesions)
    .where(inArray(lesions.visitId, draftIds))
    .orderBy(lesions.createdAt, lesions.id);
  const at = (i: number) => live[i % live.length]!;
  if (draftIds.length === 0) return 200;
  if (o.kind === "create" || live.length === 0) {
    const visitId = draftIds[("visit" in o ? o.visit : 0) % draftIds.length]!;
    const body = { clockStartH: n % 12, clockEndH: (n + 1) % 12, distanceStartCm: 1, distanceEndCm: 2, grade: "grade" in o ? o.grade : "hsil" };
    return (await POST(req("POST", `/api/visits/${visitId}/lesions`, who, body), ctx({ visitId }))).status;
  }
  const l = at(o.lesion);
  const path = `/api/visits/${l.visitId}/lesions/${l.id}`;
  if (o.kind === "grade") return (await PATCH(req("PATCH", path, who, { version: l.version, grade: o.grade }), ctx({ visitId: l.visitId, lesionId: l.id }))).status;
  if (o.kind === "delete") return (await DELETE(req("DELETE", `${path}?version=${l.version}`, who), ctx({ visitId: l.visitId, lesionId: l.id }))).status;
  // Relink to another track of the patient that has no lesion at this visit (one sighting per visit).
  const tracks = await db.select({ id: lesionTracks.id }).from(lesionTracks).where(eq(lesionTracks.patientId, patientId)).orderBy(lesionTracks.label);
  const taken = new Set(live.filter((x) => x.visitId === l.visitId).map((x) => x.trackId));
  const free = tracks.filter((t) => !taken.has(t.id));
  if (free.length === 0) return 200;
  const trackId = free[o.track % free.length]!.id;
  return (await PATCH(req("PATCH", path, who, { version: l.version, trackId }), ctx({ visitId: l.visitId, lesionId: l.id }))).status;
}

async function expectStoredEqualsRecomputed(patientId: string, step: string) {
  const read = await readTrackHistory(db, patientId);
  const key = (r: { trackId: string; visitId: string }) => `${r.trackId}|${r.visitId}`;
  const expected = [...recomputeTrackStatuses(read, siteId).values()].flat().sort((a, b) => key(a).localeCompare(key(b)));
  expect([...read.statuses].sort((a, b) => key(a).localeCompare(key(b))), step).toEqual(expected);
  const signed = new Set(read.visits.filter((v) => v.status === "signed").map((v) => v.id));
  expect(read.statuses.filter((r) => !signed.has(r.visitId)), `${step}: a status at a draft`).toEqual([]);
}

describe("track statuses kept by the writes", () => {
  it("equal a full recomputation after every write of random sequences", async () => {
    await fc.assert(
      fc.asyncProperty(grade, fc.array(op, { minLength: 1, maxLength: 12 }), async (firstGrade, ops) => {
        const { patientId, draftIds } = await newPatient(firstGrade);
        for (const [n, o] of ops.entries()) {
          const status = await apply(o, patientId, draftIds, n);
          expect([200, 201], `${o.kind} answered ${status}`).toContain(status);
          await expectStoredEqualsRecomputed(patientId, `after write ${n + 1} (${o.kind})`);
        }
      }),
      { numRuns: 40 },
    );
  });
});
