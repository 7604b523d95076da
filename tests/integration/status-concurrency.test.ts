// Concurrent status-changing writes on two visits of one patient. Track statuses are derived data:
// whatever the interleaving, the stored rows must equal a from-scratch recomputation of the
// patient's history once the writes are done (derived data never drifts from its inputs: common
// practice, no source). Each round sends lesion creates and grade changes on both visits at
// once; the grade changes hit one track seen at both visits, so each write's recomputation depends
// on the other's change (progressed / regressed at the later visit, and the metachronous rule
// across tracks).
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { lesions, lesionTracks, visits } from "@/db/schema";
import { readTrackHistory } from "@/db/queries/tracking";
import { recomputeTrackStatuses } from "@/lib/server/track-statuses";
import { GRADES, type Grade } from "@/lib/domain/vocab";
import { POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { PATCH as patchLesion } from "@/app/api/visits/[visitId]/lesions/[lesionId]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

const ROUNDS = 30;
let siteId: string, patientId: string, who: Actor;
const visitIds: string[] = [];
const shared: { id: string; visitId: string }[] = [];

beforeAll(async () => {
  siteId = (await makeSite("Concurrent")).id;
  who = await actor("clinician", [siteId]);
  patientId = (await makePatient(siteId)).id;
  for (const visitDate of ["2025-03-01", "2026-03-01"]) {
    const [v] = await db.insert(visits).values({ patientId, siteId, visitDate, examinerId: who.userId }).returning();
    visitIds.push(v!.id);
  }
  // One track seen at both visits: a grade change at either changes the later visit's status.
  const [t] = await db.insert(lesionTracks).values({ patientId, siteId, label: "T1" }).returning();
  for (const visitId of visitIds) {
    const [l] = await db
      .insert(lesions)
      .values({ visitId, siteId, trackId: t!.id, label: "L1", clockStartH: 3, clockEndH: 4, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: "lsil" })
      .returning();
    shared.push({ id: l!.id, visitId });
  }
});

async function storedAgainstRecomputed() {
  const read = await readTrackHistory(db, patientId);
  const key = (r: { trackId: string; visitId: string }) => `${r.trackId}|${r.visitId}`;
  const expected = [...recomputeTrackStatuses(read, siteId).values()].flat().sort((a, b) => key(a).localeCompare(key(b)));
  const stored = [...read.statuses].sort((a, b) => key(a).localeCompare(key(b)));
  return { stored, expected };
}

const gradeOf = (round: number, i: number): Grade => GRADES[(round * 3 + i * 2) % GRADES.length]!;

describe("a patient's status-changing writes under concurrency", () => {
  it(`leaves stored statuses equal to a full recomputation after every round of ${ROUNDS}`, async () => {
    for (let round = 0; round < ROUNDS; round++) {
      const current = await db.select({ id: lesions.id, version: lesions.version }).from(lesions).where(eq(lesions.siteId, siteId));
      const versionOf = new Map(current.map((l) => [l.id, l.version]));
      const writes = [
        ...shared.map((l, i) =>
          patchLesion(req("PATCH", `/api/visits/${l.visitId}/lesions/${l.id}`, who, { version: versionOf.get(l.id), grade: gradeOf(round, i) }), ctx({ visitId: l.visitId, lesionId: l.id })),
        ),
        ...visitIds.map((visitId, i) =>
          createLesion(
            req("POST", `/api/visits/${visitId}/lesions`, who, { clockStartH: (round + i * 6) % 12, clockEndH: (round + i * 6 + 1) % 12, distanceStartCm: 1, distanceEndCm: 2, grade: gradeOf(round, i + 1) }),
            ctx({ visitId }),
          ),
        ),
      ];
      const statuses = (await Promise.all(writes)).map((r) => r.status);
      expect(statuses, `round ${round}`).toEqual([200, 200, 201, 201]);
      const { stored, expected } = await storedAgainstRecomputed();
      expect(stored, `round ${round}`).toEqual(expected);
    }
  });
});
