import "server-only";
// Statements of a patient import. Many rows go in as one array parameter per column, turned back
// into rows by unnest, so each statement's text is the same whatever the number of rows (and
// postgres.js keeps it prepared). Risk groups, a set per patient, travel as one array literal
// per row inside a text[] (unnest would flatten an array of arrays).
import { sql as dsql } from "drizzle-orm";
import { db, type Db, type Tx } from "../client";
import { pgArrayLiteral } from "./scope";
import type { PatientValues, StoredPatient } from "@/lib/patient-import/merge";

type Run = Db | Tx;

const SELECT_STORED = dsql`select id, version, mrn, family_name as "familyName", given_name as "givenName",
  date_of_birth::text as "dateOfBirth", sex_at_birth as "sexAtBirth", zip as "postalCode",
  hiv_status as "hivStatus", risk_groups::text[] as "riskGroups", contact_email as "contactEmail"
  from patients where site_id = `;

/** The site's patients with these MRNs; `lock` holds them until the transaction ends. */
export async function patientsByMrn(run: Run, siteId: string, mrns: string[], lock: boolean): Promise<StoredPatient[]> {
  if (mrns.length === 0) return [];
  const tail = lock ? dsql` for update` : dsql``;
  return (await run.execute(dsql`${SELECT_STORED}${siteId}::uuid and mrn = any(${pgArrayLiteral(mrns)}::text[])${tail}`)) as unknown as StoredPatient[];
}

const arrays = (rows: PatientValues[]) => ({
  mrns: pgArrayLiteral(rows.map((r) => r.mrn)),
  family: pgArrayLiteral(rows.map((r) => r.familyName)),
  given: pgArrayLiteral(rows.map((r) => r.givenName)),
  born: pgArrayLiteral(rows.map((r) => r.dateOfBirth)),
  sex: pgArrayLiteral(rows.map((r) => r.sexAtBirth)),
  postal: pgArrayLiteral(rows.map((r) => r.postalCode)),
  hiv: pgArrayLiteral(rows.map((r) => r.hivStatus)),
  risks: pgArrayLiteral(rows.map((r) => pgArrayLiteral(r.riskGroups))),
  emails: pgArrayLiteral(rows.map((r) => r.contactEmail)),
});

/** New patients of one site; their ids are made by the caller. */
export async function insertPatients(run: Run, siteId: string, rows: (PatientValues & { id: string })[]): Promise<void> {
  if (rows.length === 0) return;
  const a = arrays(rows);
  await run.execute(dsql`insert into patients (id, site_id, mrn, family_name, given_name, date_of_birth, sex_at_birth, zip, hiv_status, risk_groups, contact_email)
    select id, ${siteId}::uuid, mrn, family, given, born, sex, postal, hiv, risks::risk_group[], email
    from unnest(${pgArrayLiteral(rows.map((r) => r.id))}::uuid[], ${a.mrns}::text[], ${a.family}::text[], ${a.given}::text[], ${a.born}::date[],
      ${a.sex}::sex_at_birth[], ${a.postal}::text[], ${a.hiv}::hiv_status[], ${a.risks}::text[], ${a.emails}::text[])
      as u(id, mrn, family, given, born, sex, postal, hiv, risks, email)`);
}

/**
 * New values for patients of one site, each only at the version it was read at; the version goes
 * up by one. Returns how many rows were written (fewer than given means one changed meanwhile).
 */
export async function updatePatients(run: Run, siteId: string, rows: (PatientValues & { id: string; version: number })[]): Promise<number> {
  if (rows.length === 0) return 0;
  const a = arrays(rows);
  const done = await run.execute(dsql`update patients p set family_name = u.family, given_name = u.given, sex_at_birth = u.sex, zip = u.postal,
      hiv_status = u.hiv, risk_groups = u.risks::risk_group[], contact_email = u.email, version = p.version + 1
    from unnest(${pgArrayLiteral(rows.map((r) => r.id))}::uuid[], ${pgArrayLiteral(rows.map((r) => String(r.version)))}::int[], ${a.family}::text[], ${a.given}::text[],
      ${a.sex}::sex_at_birth[], ${a.postal}::text[], ${a.hiv}::hiv_status[], ${a.risks}::text[], ${a.emails}::text[])
      as u(id, version, family, given, sex, postal, hiv, risks, email)
    where p.id = u.id and p.site_id = ${siteId}::uuid and p.version = u.version
    returning p.id`);
  return (done as unknown as unknown[]).length;
}

/** Names of these sites, for choosing where to import. */
export async function sitesNamed(siteIds: string[], run: Run = db): Promise<{ id: string; name: string }[]> {
  if (siteIds.length === 0) return [];
  return (await run.execute(dsql`select id, name from sites where id = any(${pgArrayLiteral(siteIds)}::uuid[]) order by name`)) as unknown as { id: string; name: string }[];
}
