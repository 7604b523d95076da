// Concurrent status-changing writes on two visits of one patient. Track statuses are derived data:
// whatever the interleaving, the stored rows must equal a from-scratch recomputation of the
// patient's history once the writes are done (derived data never drifts from its inputs: common
// practice, no source). Statuses come from signed visits only, so the writes that change them are
// those on signed visits: here histology results, which decide a lesion's grade for tracking. Each
// round enters results at once on both signed visits: on one track seen at both (so each write's
// recomputation depends on the other's: progressed / regressed at the later visit) and on a track
// first seen at the later visit (the metachronous rule across tracks). Lesion creates and grade
// changes on the patient's draft go at the same time: they change no status and take no status
// lock, and must neither block nor disturb the others.
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { biopsies, lesions, lesionTracks, visits } from "@/db/schema";
import { readTrackHistory } from "@/db/queries/tracking";
import { recomputeTrackStatuses } from "@/lib/server/track-statuses";
import { GRADES, HISTOLOGY, type Grade, type Histology } from "@/lib/domain/vocab";
import { POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { PATCH as patchLesion } from "@/app/api/visits/[visitId]/lesions/[lesionId]/route";
import { PATCH as enterResult } from "@/app/api/biopsies/[biopsyId]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

const ROUNDS = 30;
let siteId: string, patientId: string, draftId: string, who: Actor;
const biopsyIds: string[] = [];
let draftLesion: { id: string; version: number };

async function lesionAt(visitId: string, trackId: string, label: string, grade: Grade) {
  const [l] = await db
    .insert(lesions)
    .values({ visitId, siteId, trackId, label, clockStartH: 3, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade })
    .returning();
  return l!;
}

beforeAll(async () => {
  siteId = (await makeSite("Concurrent")).id;
  who = await actor("clinician", [siteId]);
  patientId = (await makePatient(siteId)).id;
  const signed: string[] = [];
  for (const visitDate of ["2025-03-01", "2026-03-01"]) {
    const [v] = await db.insert(visits).values({ patientId, siteId, visitDate, examinerId: who.userId, status: "signed", signedAt: new Date() }).returning();
    signed.push(v!.id);
  }
  const [d] = await db.insert(visits).values({ patientId, siteId, visitDate: "2026-09-01", examinerId: who.userId }).returning();
  draftId = d!.id;
  // Track T at both signed visits, track U at the later one only; a specimen from each sighting.
  const [t, u] = await db.insert(lesionTracks).values([{ patientId, siteId, label: "T1" }, { patientId, siteId, label: "T2" }]).returning();
  const sightings = [await lesionAt(signed[0]!, t!.id, "L1", "lsil"), await lesionAt(signed[1]!, t!.id, "L1", "lsil"), await lesionAt(signed[1]!, u!.id, "L2", "hsil")];
  for (const [i, l] of sightings.entries()) {
    const [b] = await db.insert(biopsies).values({ visitId: l.visitId, siteId, lesionId: l.id, specimenLabel: "AB"[i === 2 ? 1 : 0]!, clockH: 3.5, distanceCm: 1.5 }).returning();
    biopsyIds.push(b!.id);
  }
  const made = await createLesion(req("POST", `/api/visits/${draftId}/lesions`, who, { clockStartH: 6, clockEndH: 7, distanceStartCm: 1, distanceEndCm: 2, grade: "lsil" }), ctx({ visitId: draftId }));
  draftLesion = (await made.json()).lesion;
});

async function storedAgainstRecomputed() {
  const read = await readTrackHistory(db, patientId);
  const key = (r: { trackId: string; visitId: string }) => `${r.trackId}|${r.visitId}`;
  const expected = [...recomputeTrackStatuses(read, siteId).values()].flat().sort((a, b) => key(a).localeCompare(key(b)));
  const stored = [...read.statuses].sort((a, b) => key(a).localeCompare(key(b)));
  return { stored, expected };
}

const resultOf = (round: number, i: number): Histology => HISTOLOGY[(round * 3 + i * 2) % HISTOLOGY.length]!;
const gradeOf = (round: number): Grade => GRADES[round % GRADES.length]!;

describe("a patient's status-changing writes under concurrency", () => {
  it(`leaves stored statuses equal to a full recomputation after every round of ${ROUNDS}`, async () => {
    for (let round = 0; round < ROUNDS; round++) {
      const writes = [
        ...biopsyIds.map((id, i) => enterResult(req("PATCH", `/api/biopsies/${id}`, who, { histology: resultOf(round, i) }), ctx({ biopsyId: id }))),
        createLesion(
          req("POST", `/api/visits/${draftId}/lesions`, who, { clockStartH: round % 12, clockEndH: (round + 1) % 12, distanceStartCm: 1, distanceEndCm: 2, grade: gradeOf(round) }),
          ctx({ visitId: draftId }),
        ),
        patchLesion(req("PATCH", `/api/visits/${draftId}/lesions/${draftLesion.id}`, who, { version: draftLesion.version, grade: gradeOf(round + 1) }), ctx({ visitId: draftId, lesionId: draftLesion.id })),
      ];
      const answers = await Promise.all(writes);
      expect(answers.map((r) => r.status), `round ${round}`).toEqual([200, 200, 200, 201, 200]);
      draftLesion = (await answers[4]!.json()).lesion;
      const { stored, expected } = await storedAgainstRecomputed();
      expect(stored, `round ${round}`).toEqual(expected);
      // Every round has statuses to compare (not an empty table equal to an empty recomputation).
      expect(expected.length, `round ${round}`).toBeGreaterThan(0);
    }
  });
});
