import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { visits } from "@/db/schema";
import { POST as createLesion } from "@/app/api/visits/[visitId]/lesions/route";
import { POST as createBiopsy } from "@/app/api/visits/[visitId]/biopsies/route";
import { PATCH as enterResult } from "@/app/api/biopsies/[biopsyId]/route";
import { GET as followUp } from "@/app/api/visits/[visitId]/tracks/route";
import { GET as timeline } from "@/app/api/patients/[patientId]/timeline/route";
import { decodeTimeline } from "@/lib/timeline/wire";
import type { Timeline } from "@/lib/api/types";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// The grade an earlier track shows on the visit page (the look-again list and its outline) and on
// the compare page (the earlier visit's lesion) is one answer: histology, when there is one,
// decides over the exam impression (LAST: Darragh TM et al., Arch Pathol Lab Med 2012;136:1266-97).
let siteId: string;
let clinician: Actor;

beforeAll(async () => {
  siteId = (await makeSite()).id;
  clinician = await actor("clinician", [siteId]);
});

async function visit(patientId: string, date: string) {
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: date, examinerId: clinician.userId, status: "draft" }).returning();
  return v!.id;
}

async function lesionWithResult(visitId: string, grade: string, histology: string) {
  const { lesion } = await (await createLesion(req("POST", "/x", clinician, { clockStartH: 2, clockEndH: 4, distanceStartCm: 0.5, distanceEndCm: 1.5, grade }), ctx({ visitId }))).json();
  const { biopsy } = await (await createBiopsy(req("POST", "/x", clinician, { lesionId: lesion.id }), ctx({ visitId }))).json();
  expect((await enterResult(req("PATCH", "/x", clinician, { histology }), ctx({ biopsyId: biopsy.id }))).status).toBe(200);
  return lesion as { id: string; trackId: string };
}

describe("an earlier track's grade on the visit page and the compare page", () => {
  for (const [impression, histology, expected] of [
    ["hsil", "lsil", "lsil"],
    ["lsil", "hsil", "hsil"],
    ["condyloma", "scc", "suspected_cancer"],
  ] as const) {
    it(`agree when the impression (${impression}) and the histology (${histology}) differ: ${expected}`, async () => {
      const patientId = (await makePatient(siteId)).id;
      const v1 = await visit(patientId, "2025-01-10");
      const lesion = await lesionWithResult(v1, impression, histology);
      await db.update(visits).set({ status: "signed" }).where(eq(visits.id, v1));
      const v2 = await visit(patientId, "2025-07-10");

      const fu = await (await followUp(req("GET", "/x", clinician), ctx({ visitId: v2 }))).json();
      const ghost = fu.ghosts.find((g: { trackId: string }) => g.trackId === lesion.trackId);
      const t = decodeTimeline<Timeline>(JSON.parse(await (await timeline(req("GET", "/x", clinician), ctx({ patientId }))).text()));
      const onCompare = t.lesions.find((l) => l.id === lesion.id)!;

      expect(ghost.grade).toBe(onCompare.effectiveGrade);
      expect(ghost.grade).toBe(expected);
      // The impression stays available (a "Found" lesion starts from it), beside the histology.
      expect(ghost).toMatchObject({ impression, histology });
    });
  }
});
