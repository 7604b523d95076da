// The invented demo scenario: an invented clinic group, invented staff and patients, invented
// dates. Deterministic (seeded faker), so every run builds the same records.
import { faker } from "@faker-js/faker";
import type { Grade, Histology, Modality, RiskGroup } from "@/lib/domain/vocab";
import { trackLabel } from "@/lib/domain/track-label";
import { zoneForDistance } from "@/lib/geometry/zones";
import { normalizeHours } from "@/lib/geometry/clock";

export { DEMO_PASSWORD } from "@/lib/domain/demo-accounts";

export const DEMO_SITES = [
  { code: "HBR", name: "Harbour Street Anoscopy Clinic" },
  { code: "MLB", name: "Millbrook Community Clinic" },
] as const;

export const DEMO_USERS = [
  { id: "u-clin-okafor", email: "clinician@dentate.example", displayName: "Dr Ines Okafor", role: "clinician", sites: ["HBR"] },
  { id: "u-clin-reyes", email: "np.reyes@dentate.example", displayName: "Tomas Reyes, NP", role: "clinician", sites: ["HBR"] },
  { id: "u-rev-lindqvist", email: "reviewer@dentate.example", displayName: "Dr Priya Lindqvist", role: "reviewer", sites: ["HBR"] },
  { id: "u-nurse-moreau", email: "nurse@dentate.example", displayName: "Hana Moreau, RN", role: "research_nurse", sites: ["HBR"] },
  { id: "u-admin-whitley", email: "admin@dentate.example", displayName: "Sam Whitley", role: "admin", sites: ["HBR", "MLB"] },
  { id: "u-clin-brooks", email: "clinician@millbrook.example", displayName: "Dr Elan Brooks", role: "clinician", sites: ["MLB"] },
] as const;

export interface SeedLesion {
  trackKey: string;
  clockStartH: number;
  clockEndH: number;
  distanceStartCm: number;
  distanceEndCm: number;
  grade: Grade;
  histology: Histology | null;
  treated: Modality | null;
}
export interface SeedVisit {
  date: string;
  examiner: string;
  lesions: SeedLesion[];
  notFound: string[];
}
export interface SeedPatient {
  siteCode: string;
  mrn: string;
  familyName: string;
  givenName: string;
  dateOfBirth: string;
  sexAtBirth: "female" | "male";
  genderIdentity: string;
  hivStatus: "positive" | "negative" | "unknown";
  riskGroup: RiskGroup;
  zip: string;
  email: string;
  consentEmail: boolean;
  consentResearch: boolean;
  visits: SeedVisit[];
}

const GRADE_STEP: Grade[] = ["lsil", "hsil", "hsil", "condyloma", "lsil", "hsil"];

function isoDate(d: Date): string {
  return d.toISOString().slice(0, 10);
}

function addMonths(date: Date, months: number): Date {
  const d = new Date(date);
  d.setUTCMonth(d.getUTCMonth() + months);
  return d;
}

// How long before the seed's run date each patient's last visit lies, in days, by patient number.
// Against the usual 3-, 6- and 12-month intervals this gives a few patients due this week, a few
// overdue by days or weeks, and the rest not yet due; no one is years overdue.
const LAST_VISIT_LAG_DAYS = [14, 88, 60, 95, 100, 30, 91, 110, 120, 180, 86, 200, 150, 240, 45] as const;

const DAY_MS = 86_400_000;
const shiftIso = (iso: string, days: number) => new Date(Date.parse(`${iso}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);

/**
 * The invented clinic, laid out so that each patient's last visit lies a set number of days before
 * `today` (the day the seed runs): the same run date always gives the same records.
 */
export function buildScenario(today: Date = new Date()): SeedPatient[] {
  const todayIso = today.toISOString().slice(0, 10);
  faker.seed(20261201);
  const out: SeedPatient[] = [];
  const zips = ["02139", "10027", "03601", "94110", "60614", "87901", "33139"];
  for (let i = 0; i < 30; i++) {
    const siteCode = i < 25 ? "HBR" : "MLB";
    const sex = faker.helpers.arrayElement(["male", "male", "female"] as const);
    const hiv = faker.helpers.arrayElement(["positive", "positive", "negative", "unknown"] as const);
    const risk: RiskGroup = hiv === "positive" ? (sex === "male" ? "msm_tw_hiv" : "other_hiv") : faker.helpers.arrayElement(["msm_tw_no_hiv", "solid_organ_transplant", "cervical_vaginal_hsil_or_cancer", "perianal_warts"] as const);
    const dob = faker.date.birthdate({ min: 28, max: i === 3 ? 93 : 72, mode: "age", refDate: new Date("2026-06-01T00:00:00Z") });
    const givenName = faker.person.firstName(sex);
    const familyName = faker.person.lastName();
    const visitCount = 1 + (i % 6);
    const examiners = siteCode === "HBR" ? ["u-clin-okafor", "u-clin-reyes"] : ["u-clin-brooks"];
    // Visits every 4–7 months, the last one in 2024–2026.
    let when = faker.date.between({ from: "2023-06-01T00:00:00Z", to: "2024-09-01T00:00:00Z" });
    const tracks = Array.from({ length: 1 + (i % 4) }, (_, t) => {
      const start = normalizeHours(faker.number.int({ min: 0, max: 23 }) / 2);
      const lenH = faker.helpers.arrayElement([0.5, 1, 1.5, 2, 3]);
      const d0 = faker.helpers.arrayElement([-2, -1, 0, 0.5, 1, 1.5, 2, 2.5]);
      return { key: trackLabel(t + 1), start, end: normalizeHours(start + lenH), d0, d1: d0 + faker.helpers.arrayElement([0.5, 1, 1.5]), grade: GRADE_STEP[(i + t) % GRADE_STEP.length]!, cleared: false, firstVisit: t % 2 === 0 ? 0 : 1 };
    });
    const visits: SeedVisit[] = [];
    for (let v = 0; v < visitCount; v++) {
      const lesions: SeedLesion[] = [];
      const notFound: string[] = [];
      for (const t of tracks) {
        if (v < t.firstVisit) continue;
        if (t.cleared) {
          // Most treated sites stay clear; a few come back (recurrence after a clear visit).
          if (faker.number.float() < 0.2) t.cleared = false;
          else { notFound.push(t.key); continue; }
        }
        if (v > t.firstVisit && faker.number.float() < 0.15) t.grade = t.grade === "lsil" ? "hsil" : t.grade;
        const biopsy = t.grade === "hsil" || faker.number.float() < 0.3;
        const histology: Histology | null = biopsy ? (t.grade === "hsil" ? (faker.number.float() < 0.85 ? "hsil" : "lsil") : t.grade === "condyloma" ? "lsil" : t.grade === "lsil" ? "lsil" : "benign") : null;
        const treat = (histology === "hsil" || t.grade === "hsil") && v < visitCount - 1 && faker.number.float() < 0.7;
        lesions.push({
          trackKey: t.key,
          clockStartH: t.start,
          clockEndH: t.end,
          distanceStartCm: t.d0,
          distanceEndCm: t.d1,
          grade: t.grade,
          histology,
          treated: treat ? faker.helpers.arrayElement(["electrocautery", "electrocautery", "infrared_coagulation"] as const) : null,
        });
        if (treat) t.cleared = true;
      }
      visits.push({ date: isoDate(when), examiner: examiners[v % examiners.length]!, lesions, notFound });
      when = addMonths(when, faker.number.int({ min: 4, max: 7 }));
    }
    // The whole history moves together, so intervals between visits are kept.
    const last = visits.at(-1)!.date;
    const target = shiftIso(todayIso, -LAST_VISIT_LAG_DAYS[i % LAST_VISIT_LAG_DAYS.length]!);
    const shift = Math.round((Date.parse(`${target}T00:00:00Z`) - Date.parse(`${last}T00:00:00Z`)) / DAY_MS);
    for (const v of visits) v.date = shiftIso(v.date, shift);
    out.push({
      siteCode,
      mrn: `${siteCode}-${String(100200 + i * 37).padStart(7, "0")}`,
      familyName,
      givenName,
      dateOfBirth: isoDate(dob),
      sexAtBirth: sex,
      genderIdentity: sex === "male" ? faker.helpers.arrayElement(["man", "man", "transgender woman"]) : "woman",
      hivStatus: hiv,
      riskGroup: risk,
      zip: faker.helpers.arrayElement(zips),
      email: `${givenName}.${familyName}`.toLowerCase().replace(/[^a-z.]/g, "") + "@mail.example",
      consentEmail: i % 3 !== 0,
      consentResearch: i % 2 === 0,
      visits,
    });
  }
  return out;
}

export function zoneOf(startCm: number, endCm: number) {
  return zoneForDistance((startCm + endCm) / 2) ?? "distal_canal";
}
