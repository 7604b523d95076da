import { describe, expect, it } from "vitest";
import { latestSignedPair, orderedPair } from "./review-model";
import type { TimelineVisit } from "@/components/timeline/timeline-types";

// Compare opens on the latest two signed visits: a draft has no statuses yet, so comparing against
// it would show every earlier lesion as gone (rule: statuses come from signed visits only).
const visit = (id: string, visitDate: string, status: "draft" | "signed"): TimelineVisit =>
  ({ id, visitDate, status, patientPosition: "lithotomy", examiner: "Dr A", examinerId: "u1" }) as TimelineVisit;
const visits = [visit("v1", "2025-01-10", "signed"), visit("v2", "2025-07-10", "signed"), visit("v3", "2026-01-10", "draft")];

describe("compare defaults", () => {
  it("defaults to the latest two signed visits, not to a later draft", () => {
    expect(orderedPair(visits)?.map((v) => v.id)).toEqual(["v1", "v2"]);
    expect(orderedPair(visits, "v3", "missing")?.map((v) => v.id)).toEqual(["v1", "v2"]);
    expect(latestSignedPair(visits)?.map((v) => v.id)).toEqual(["v1", "v2"]);
  });
  it("keeps a pair that was chosen, draft included, in time order", () => {
    expect(orderedPair(visits, "v3", "v1")?.map((v) => v.id)).toEqual(["v1", "v3"]);
  });
  it("has no default with fewer than two signed visits", () => {
    expect(orderedPair([visits[0]!, visits[2]!])).toBeNull();
  });
});
