// The timeline's wire form must give the screens exactly what JSON of the assembled timeline gave
// them (a lossless encoding: common practice, no source), whatever the values: nulls, yes/no,
// fractional clock hours, repeated and unique words.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { assembleTimeline, type TimelineRows } from "./assemble";
import { decodeTimeline, encodeTimeline, packUuid, unpackUuid } from "./wire";

const V1 = "0b7e2a1c-5d3f-4e8a-9c21-7f6d5e4c3b2a";
const V2 = "ffffffff-0000-4fff-8000-000000000001";
const T1 = "a1b2c3d4-e5f6-4789-abcd-ef0123456789";
const rows: TimelineRows = {
  patient: { id: "11111111-2222-4333-8444-555555555555", siteId: "66666666-7777-4888-9999-aaaaaaaaaaaa", familyName: "Invented", givenName: "Ada", mrn: "MRN-1" },
  visits: [
    { id: V1, visitDate: "2025-01-10", status: "signed", patientPosition: "lithotomy", examiner: "Dr Example", examinerId: "bbbbbbbb-cccc-4ddd-8eee-ffffffffffff" },
    { id: V2, visitDate: "2025-07-10", status: "draft", patientPosition: "prone_jackknife", examiner: "Dr Example", examinerId: "bbbbbbbb-cccc-4ddd-8eee-ffffffffffff" },
  ],
  tracks: [{ id: T1, label: "T1" }],
  lesions: [
    { id: "00000000-0000-4000-8000-000000000000", visitId: V1, trackId: T1, label: "L1", clockStartH: 0.30000000000000004, clockEndH: 11.5, distanceStartCm: -1.5, distanceEndCm: 2, zone: "transformation_zone", grade: "hsil", version: 3 },
    { id: "9f8e7d6c-5b4a-4938-8271-605f4e3d2c1b", visitId: V2, trackId: null, label: "L2", clockStartH: 6, clockEndH: 7.25, distanceStartCm: 0, distanceEndCm: 0.5, zone: "perianal", grade: "lsil", version: 1 },
  ],
  biopsies: [{ lesionId: "00000000-0000-4000-8000-000000000000", label: "A", histology: "lsil" }],
  treatments: [{ visitId: V1, lesionId: "00000000-0000-4000-8000-000000000000", arcs: [{ startH: 11, endH: 1 }], modality: "electrocautery" }],
  statuses: [{ trackId: T1, visitId: V1, status: "new", effectiveGrade: "lsil", reason: "first seen at visit 1" }],
  checks: [{ visitId: V2, trackId: T1, outcome: "not_found" }],
  reviews: [],
  adjudications: [],
};

describe("timeline wire form", () => {
  it("decodes to exactly the JSON of the assembled timeline", () => {
    const assembled = assembleTimeline(rows);
    const sent = JSON.parse(JSON.stringify(encodeTimeline(assembled)));
    expect(decodeTimeline(sent)).toEqual(JSON.parse(JSON.stringify(assembled)));
  });

  it("keeps uuids and other ids exactly", () => {
    for (const id of [V1, V2, T1, "00000000-0000-4000-8000-000000000000", "ffffffff-ffff-4fff-bfff-ffffffffffff"]) {
      expect(packUuid(id)).toHaveLength(22);
      expect(unpackUuid(packUuid(id))).toBe(id);
    }
    for (const id of ["not-a-uuid", "ABCDEFAB-CDEF-4ABC-8DEF-ABCDEFABCDEF", "x".repeat(22)]) expect(unpackUuid(packUuid(id))).toBe(id);
  });

  it("packs any uuid into 22 characters and back exactly", () => {
    fc.assert(
      fc.property(fc.uuid(), (id) => {
        expect(packUuid(id)).toMatch(/^[A-Za-z0-9_-]{22}$/);
        expect(unpackUuid(packUuid(id))).toBe(id);
      }),
      { numRuns: 500 },
    );
  });

  it("carries every field of each lesion row into the assembled lesion", () => {
    const assembled = assembleTimeline(rows);
    rows.lesions.forEach((row, i) => expect(assembled.lesions[i]).toMatchObject(row));
  });

  it("refuses a format it does not know", () => {
    expect(() => decodeTimeline({ ...encodeTimeline(assembleTimeline(rows)), v: 2 as 1 })).toThrow(/format/);
  });
});
