// Generates an invented registry of 10,000 patients, ~60,000 visits and ~200,000 lesions in a
// separate site (code SCL) with study SCL-REG-01, for the export bench. Rows are built in process
// and loaded with COPY FROM STDIN; track statuses come from lib/tracking on the same in-memory
// histories, so nothing is computed twice. Idempotent: does nothing when site SCL exists.
// Run: DATABASE_URL=… node_modules/.bin/tsx --conditions=react-server scripts/seed-scale.ts
import { randomUUID } from "node:crypto";
import postgres from "postgres";
import type { Grade, Histology } from "@/lib/domain/vocab";
import { zoneForDistance } from "@/lib/geometry/zones";
import { treatedFraction } from "@/lib/dosing/extent";
import { trackStatuses, withMetachronousContext, type TrackHistory } from "@/lib/tracking";
import { runScript } from "@/db/client";
import { trackLabel } from "@/lib/domain/track-label";

const PATIENTS = Number(process.env.SCALE_PATIENTS ?? 10_000);
const CHUNK = 10_000;
const url = process.env.DATABASE_URL;
if (!url) throw new Error("DATABASE_URL is not set");
const sql = postgres(url, { max: 2, onnotice: () => {} });

// Small deterministic generator (mulberry32) so every run builds the same registry.
let seed = 20261202;
function rand(): number {
  seed = (seed + 0x6d2b79f5) | 0;
  let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
  t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
  return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
}
const int = (min: number, max: number) => min + Math.floor(rand() * (max - min + 1));
const pick = <T,>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)]!;
const SYL = ["ka", "lo", "mir", "ten", "sa", "vo", "rin", "da", "bel", "quo", "ze", "than", "pri", "mu", "wen"];
const word = (n: number) => { const w = Array.from({ length: n }, () => pick(SYL)).join(""); return w[0]!.toUpperCase() + w.slice(1); };
const iso = (day: number) => new Date(day * 86_400_000).toISOString().slice(0, 10);
const dayOf = (s: string) => Math.round(Date.parse(`${s}T00:00:00Z`) / 86_400_000);
const N = "\\N";

type Row = (string | number | boolean | null)[];
const line = (r: Row) => r.map((v) => (v === null ? N : String(v))).join("\t") + "\n";

async function copyRows(table: string, columns: string[], rows: Iterable<Row>): Promise<number> {
  const stream = await sql.unsafe(`COPY ${table} (${columns.join(", ")}) FROM STDIN`).writable();
  let n = 0;
  let buf = "";
  for (const r of rows) {
    buf += line(r);
    n++;
    if (buf.length > 1 << 20) {
      if (!stream.write(buf)) await new Promise((res) => stream.once("drain", res));
      buf = "";
    }
  }
  await new Promise<void>((resolve, reject) => {
    stream.on("error", reject);
    stream.end(buf, () => resolve());
  });
  // The COPY completes when the server acknowledges; wait for the stream to close.
  await new Promise((r) => (stream.closed ? r(null) : stream.once("close", r)));
  return n;
}

async function main() {
  const [existing] = await sql`SELECT id FROM sites WHERE code = 'SCL'`;
  if (existing) {
    console.log("scale registry already present: nothing added");
    return;
  }
  const started = Date.now();
  const siteId = randomUUID();
  const studyId = randomUUID();
  const examiners = ["u-scale-exam-1", "u-scale-exam-2", "u-scale-exam-3"];
  await sql.begin(async (tx) => {
    await tx`INSERT INTO sites (id, code, name) VALUES (${siteId}, 'SCL', 'Scale registry clinic (invented)')`;
    for (const [i, id] of examiners.entries()) {
      await tx`INSERT INTO users (id, email, display_name, role, active) VALUES (${id}, ${`scale.examiner${i + 1}@dentate.example`}, ${`Scale examiner ${i + 1}`}, 'clinician', false) ON CONFLICT (id) DO NOTHING`;
      await tx`INSERT INTO user_sites (user_id, site_id) VALUES (${id}, ${siteId})`;
    }
    // The demo admin and research nurse may see the scale site, so the bench can sign in as either.
    await tx`INSERT INTO user_sites (user_id, site_id) SELECT id, ${siteId} FROM users WHERE id IN ('u-admin-whitley', 'u-nurse-moreau')`;
    await tx`INSERT INTO studies (id, code, title, start_date) VALUES (${studyId}, 'SCL-REG-01', 'Scale registry (invented)', '2022-01-01')`;
    await tx`INSERT INTO study_sites (study_id, site_id) VALUES (${studyId}, ${siteId})`;
  });

  const grades: Grade[] = ["benign", "condyloma", "lsil", "lsil", "hsil", "hsil"];
  const counts: Record<string, number> = {};
  const add = (k: string, n: number) => (counts[k] = (counts[k] ?? 0) + n);
  // Built and copied 10,000 patients at a time, so 100,000 (SCALE_PATIENTS) fit in memory.
  for (let from = 0; from < PATIENTS; from += CHUNK) {
    const patients: Row[] = [], visits: Row[] = [], tracks: Row[] = [], lesions: Row[] = [], biopsies: Row[] = [], treatments: Row[] = [], statuses: Row[] = [], enrolments: Row[] = [];
    for (let p = from; p < Math.min(PATIENTS, from + CHUNK); p++) {
      const pid = randomUUID();
      const dob = iso(dayOf("1940-01-01") + int(0, 365 * 55));
      patients.push([pid, siteId, `SCL-${String(p + 1).padStart(6, "0")}`, word(2), word(2), dob, pick(["male", "male", "female"]), pick(["positive", "negative", "unknown"]), "{other}", String(int(10000, 99999)), true]);
      let day = dayOf("2022-01-01") + int(0, 700);
      const nVisits = int(3, 9);
      const trackDefs = Array.from({ length: int(3, 6) }, (_, t) => {
        const start = int(0, 23) / 2;
        const d0 = pick([-2, -1, 0, 0.5, 1, 1.5, 2]);
        return { id: randomUUID(), label: trackLabel(t + 1), start, end: (start + pick([0.5, 1, 2])) % 12, d0, d1: d0 + pick([0.5, 1]), grade: pick(grades), cleared: false };
      });
      for (const t of trackDefs) tracks.push([t.id, pid, siteId, t.label]);
      const histories: TrackHistory[] = trackDefs.map((t) => ({ trackId: t.id, label: t.label, observations: [] }));
      for (let v = 0; v < nVisits; v++) {
        const vid = randomUUID();
        const date = iso(day);
        const examiner = pick(examiners);
        const startedAt = `${date}T09:00:00Z`;
        visits.push([vid, pid, siteId, date, examiner, v === 0 ? "hsil" : "not_done", "signed", `${date}T11:00:00Z`, examiner, startedAt, `${date}T09:${String(int(8, 25)).padStart(2, "0")}:00Z`]);
        let label = 0, specimen = 0;
        trackDefs.forEach((t, ti) => {
          const obs = { visitId: vid, visitDate: date, lookedFor: true } as const;
          const seen = !t.cleared ? rand() < 0.97 : rand() < 0.15;
          if (!seen) return void histories[ti]!.observations.push({ ...obs, seen: false, treatedAtVisit: false });
          t.cleared = false;
          if (rand() < 0.1) t.grade = pick(grades);
          const lid = randomUUID();
          lesions.push([lid, vid, siteId, t.id, `L${++label}`, t.start, t.end, t.d0, t.d1, zoneForDistance((t.d0 + t.d1) / 2) ?? "distal_canal", t.grade, t.grade === "condyloma" ? "papillary" : "flat", t.grade === "hsil" ? "dense" : "faint", "partial", t.grade === "hsil" ? "{punctation,mosaic}" : "{}", 3 + label]);
          let histology: Histology | null = null;
          if (specimen < 26 && (t.grade === "hsil" || rand() < 0.2)) {
            histology = t.grade === "hsil" ? (rand() < 0.85 ? "hsil" : "lsil") : t.grade === "benign" ? "benign" : "lsil";
            biopsies.push([randomUUID(), vid, siteId, lid, String.fromCharCode(65 + specimen++), t.start, t.d0, histology, histology === "hsil" ? "block_positive" : "not_done"]);
          }
          const treat = t.grade === "hsil" && v < nVisits - 1 && rand() < 0.6;
          if (treat) {
            const arcs = [{ startH: t.start, endH: t.end }];
            treatments.push([randomUUID(), vid, siteId, lid, pick(["electrocautery", "infrared_coagulation"]), JSON.stringify(arcs), treatedFraction(arcs)]);
            t.cleared = true;
          }
          histories[ti]!.observations.push({ ...obs, seen: true, impressionGrade: t.grade, histology, treatedAtVisit: treat });
        });
        day += int(90, 200);
      }
      for (const h of withMetachronousContext(histories)) {
        for (const s of trackStatuses(h.observations, { earlierDiseaseElsewhere: h.earlierDiseaseElsewhere })) {
          if (s.status !== null) statuses.push([h.trackId, s.visitId, siteId, s.status, s.effectiveGrade ?? null, s.reason]);
        }
      }
      enrolments.push([randomUUID(), studyId, pid, siteId, `SCL-${String(p + 1).padStart(5, "0")}`, String(visits.at(-nVisits)![3])]);
    }
    add("patients", await copyRows("patients", ["id", "site_id", "mrn", "family_name", "given_name", "date_of_birth", "sex_at_birth", "hiv_status", "risk_groups", "zip", "consent_research"], patients));
    add("visits", await copyRows("visits", ["id", "patient_id", "site_id", "visit_date", "examiner_id", "cytology", "status", "signed_at", "signed_by", "exam_started_at", "exam_ended_at"], visits));
    add("tracks", await copyRows("lesion_tracks", ["id", "patient_id", "site_id", "label"], tracks));
    add("lesions", await copyRows("lesions", ["id", "visit_id", "site_id", "track_id", "label", "clock_start_h", "clock_end_h", "distance_start_cm", "distance_end_cm", "zone", "grade", "morphology", "acetowhite", "lugol", "vessels", "size_mm"], lesions));
    add("biopsies", await copyRows("biopsies", ["id", "visit_id", "site_id", "lesion_id", "specimen_label", "clock_h", "distance_cm", "histology", "p16"], biopsies));
    add("treatments", await copyRows("treatments", ["id", "visit_id", "site_id", "lesion_id", "modality", "arcs", "treated_fraction"], treatments));
    add("trackStatuses", await copyRows("track_statuses", ["track_id", "visit_id", "site_id", "status", "effective_grade", "reason"], statuses));
    add("enrolments", await copyRows("enrolments", ["id", "study_id", "patient_id", "site_id", "study_subject_id", "consent_date"], enrolments));
  }
  await sql`ANALYZE`;
  console.log(JSON.stringify({ site: "SCL", study: "SCL-REG-01", seconds: Math.round((Date.now() - started) / 1000), ...counts }));
}

runScript(main, sql);
