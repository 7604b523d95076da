// Two clinicians save the same lesion from the same version at the same moment. Optimistic
// concurrency (a version column checked on write; common practice, no source; the behaviour
// asked for by the product's own rules: "exactly one wins, the other gets 409, nothing is
// silently lost"): exactly one 200, one 409, and the stored row is the winner's change.
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { lesions, visits } from "@/db/schema";
import { PATCH as patchLesion } from "@/app/api/visits/[visitId]/lesions/[lesionId]/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

let siteId: string, visitId: string, first: Actor, second: Actor;

beforeAll(async () => {
  siteId = (await makeSite("C")).id;
  first = await actor("clinician", [siteId]);
  second = await actor("clinician", [siteId]);
  const patient = await makePatient(siteId);
  const [v] = await db.insert(visits).values({ patientId: patient.id, siteId, visitDate: "2026-03-04", examinerId: first.userId }).returning();
  visitId = v!.id;
});

describe("concurrent edits of one lesion", () => {
  it("lets exactly one of two simultaneous saves from the same version win, 20 times over", async () => {
    for (let round = 0; round < 20; round++) {
      const [l] = await db
        .insert(lesions)
        .values({ visitId, siteId, label: `L${round + 1}`, clockStartH: 1, clockEndH: 2, distanceStartCm: 1, distanceEndCm: 2, zone: "transformation_zone", grade: "lsil" })
        .returning();
      const lesionId = l!.id;
      const edits = [
        { who: first, body: { version: 1, grade: "hsil", note: `first ${round}`, sizeMm: 4 } },
        { who: second, body: { version: 1, grade: "lsil", note: `second ${round}`, sizeMm: 9 } },
      ];
      const answers = await Promise.all(
        edits.map((e) => patchLesion(req("PATCH", `/api/visits/${visitId}/lesions/${lesionId}`, e.who, e.body), ctx({ visitId, lesionId }))),
      );
      const statuses = answers.map((a) => a.status).sort();
      expect(statuses, `round ${round}`).toEqual([200, 409]);
      const loser = answers.find((a) => a.status === 409)!;
      expect((await loser.json()).error.code).toBe("conflict");
      const winner = edits[answers.findIndex((a) => a.status === 200)]!;
      const [row] = await db.select().from(lesions).where(eq(lesions.id, lesionId));
      expect(row!.version).toBe(2);
      expect(row!.grade).toBe(winner.body.grade);
      expect(row!.note).toBe(winner.body.note);
      expect(row!.sizeMm).toBe(winner.body.sizeMm);
    }
  });
});
