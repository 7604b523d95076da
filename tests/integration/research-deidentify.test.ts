// The SQL de-identification (db/migrations/0002_deidentify_functions.sql) must agree with the TypeScript rules in
// lib/deidentify, which are the tested specification of HIPAA Safe Harbor (45 CFR 164.514(b)(2);
// 45 CFR 164.514(b)(2), HHS guidance). Both run here on the same invented records and are compared.
import { beforeAll, describe, expect, it } from "vitest";
import { sql } from "@/db/client";
import { ageCategory, dayOffset, deidentifyPatient, yearOnly, zip3 } from "@/lib/deidentify";
import { makePatient, makeSite } from "../fixtures/factory";

// Invented records chosen for the edges: leap-day births, the 90th birthday on and around the
// enrolment day, an age that passes 89 between enrolment and export, restricted and malformed ZIPs.
const RECORDS = [
  { dob: "1933-03-10", enrol: "2024-06-01", zip: "03601" }, // 91 at enrolment; restricted 036
  { dob: "1934-06-01", enrol: "2024-06-01", zip: "89301-1234" }, // 90th birthday on the day; ZIP+4, restricted 893
  { dob: "1934-06-02", enrol: "2024-06-01", zip: "10011" }, // the day before the 90th birthday
  { dob: "2000-02-29", enrol: "2001-02-28", zip: " 10027 " }, // leap-day birth, not yet 1
  { dob: "2000-02-29", enrol: "2001-03-01", zip: "102" }, // leap-day birth, 1 on 1 March; 3 digits only
  { dob: "1930-06-01", enrol: "2019-12-31", zip: "100111" }, // 89 at enrolment, over 89 at export
  { dob: "1968-04-17", enrol: "2024-02-10", zip: "ABCDE" },
  { dob: "1990-12-31", enrol: "2023-01-01", zip: null },
  { dob: "1975-07-04", enrol: "2024-02-29", zip: "82301" }, // 823 restricted
  { dob: "1975-07-04", enrol: "2024-02-29", zip: "82401" }, // 824 is not on the list
  { dob: "1980-01-01", enrol: "2025-11-30", zip: "69212-" }, // malformed ZIP+4
  { dob: "1980-01-01", enrol: "2025-11-30", zip: "05901\t" }, // trailing tab, restricted 059
  { dob: "1980-01-01", enrol: "2025-11-30", zip: "\t60614" }, // leading tab, unrestricted 606
];
const AS_OF = "2026-01-15";
const VISIT_DATES = ["2023-12-25", "2024-01-01", "2024-03-01", "2026-02-28"];

let ids: string[] = [];

beforeAll(async () => {
  const site = await makeSite("Deid");
  ids = [];
  for (const r of RECORDS) ids.push((await makePatient(site.id, { dateOfBirth: r.dob, zip: r.zip })).id);
});

describe("SQL de-identification agrees with lib/deidentify", () => {
  it("gives the same ZIP prefix, age category and birth year for every invented record", async () => {
    const rows = await sql<{ id: string; zip3: string; age: string; birth_year: number | null }[]>`
      SELECT p.id, dentate_zip3(p.zip) AS zip3, dentate_age_category(p.date_of_birth, r.enrol::date) AS age,
        dentate_birth_year(p.date_of_birth, r.enrol::date, ${AS_OF}::text::date) AS birth_year
      FROM patients p JOIN unnest(${ids}::text[], ${RECORDS.map((r) => r.enrol)}::text[]) AS r(id, enrol) ON r.id::uuid = p.id`;
    const byId = new Map(rows.map((r) => [r.id, r]));
    RECORDS.forEach((r, i) => {
      const ts = deidentifyPatient(
        { id: ids[i]!, dateOfBirth: r.dob, zip: r.zip, sexAtBirth: "male", hivStatus: "unknown", riskGroups: ["other"] },
        { enrolmentDate: r.enrol, studySubjectId: `S-${i}`, dateMode: "year", asOfDate: AS_OF },
      );
      const got = byId.get(ids[i]!)!;
      expect({ zip3: got.zip3, age: got.age, birthYear: got.birth_year }, JSON.stringify(r)).toEqual({ zip3: ts.zip3, age: ts.ageCategory, birthYear: ts.birthYear });
      expect(got.zip3).toBe(zip3(r.zip));
      expect(got.age).toBe(ageCategory(r.dob, r.enrol));
    });
  });

  it("reproduces the Safe Harbor facts themselves, not only the TypeScript output", async () => {
    const rows = await sql<{ id: string; zip3: string; age: string; birth_year: number | null }[]>`
      SELECT p.id, dentate_zip3(p.zip) AS zip3, dentate_age_category(p.date_of_birth, r.enrol::date) AS age,
        dentate_birth_year(p.date_of_birth, r.enrol::date, ${AS_OF}::text::date) AS birth_year
      FROM patients p JOIN unnest(${ids}::text[], ${RECORDS.map((r) => r.enrol)}::text[]) AS r(id, enrol) ON r.id::uuid = p.id`;
    const at = (i: number) => rows.find((r) => r.id === ids[i])!;
    // Ages over 89 form one category, 90 or older (45 CFR 164.514(b)(2)(i)(C)).
    expect(at(0).age).toBe("90+");
    expect(at(0).birth_year).toBeNull();
    expect(at(1).age).toBe("90+"); // 90 on the birthday itself: completed years (common practice, no source)
    expect(at(2).age).toBe("89");
    // The 17 restricted 3-digit ZIP areas become 000 (HHS guidance, 45 CFR 164.514(b)(2), HHS guidance).
    expect([at(0).zip3, at(1).zip3, at(8).zip3, at(11).zip3]).toEqual(["000", "000", "000", "000"]);
    expect(at(9).zip3).toBe("824");
    expect(at(12).zip3).toBe("606");
    // 89 at enrolment, 95 at export: the year would reveal an age over 89, so it is withheld.
    expect(at(5).age).toBe("89");
    expect(at(5).birth_year).toBeNull();
  });

  it("gives the same day offsets and years for visit dates around the enrolment day", async () => {
    const anchor = "2024-01-01";
    const rows = await sql<{ d: string; offset: number; year: number }[]>`
      SELECT t AS d, dentate_day_offset(t::date, ${anchor}::text::date) AS offset, dentate_year_only(t::date) AS year
      FROM unnest(${VISIT_DATES}::text[]) AS t`;
    for (const r of rows) {
      expect(r.offset, r.d).toBe(dayOffset(r.d, anchor));
      expect(r.year, r.d).toBe(yearOnly(r.d));
    }
    // By hand: 2024 is a leap year, so 1 Jan to 1 Mar is 31 + 29 = 60 days; 25 Dec is 7 days before.
    expect(rows.map((r) => r.offset)).toEqual([-7, 0, 60, 789]);
  });
});
