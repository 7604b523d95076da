// Bench fixtures, inserted straight into the bench database (never the demo or test ones):
// a session for the demo clinician, a draft visit with 200 lesions for the map, a patient with
// 30 visits × 40 lesions for the timeline, and draft visits for the load test (argument, default
// 100; api-load.mjs spreads its writes over them). Prints one JSON object for the other bench steps.
// Run: DATABASE_URL=… tsx --conditions=react-server scripts/bench/prepare.ts [load-visits]
import { and, eq } from "drizzle-orm";
import { db, runScript } from "@/db/client";
import { lesions, lesionTracks, patients, sites, visits } from "@/db/schema";
import { refreshTrackStatuses } from "@/lib/server/track-statuses";
import { createSession, SESSION_COOKIE } from "@/lib/auth/session";
import { GRADES } from "@/lib/domain/vocab";
import { trackLabel } from "@/lib/domain/track-label";

const CLINICIAN = "u-clin-okafor";
const SLOTS = Number(process.argv[2] ?? 100);

async function benchPatient(siteId: string, mrn: string, familyName: string) {
  const [p] = await db
    .insert(patients)
    .values({ siteId, mrn, familyName, givenName: "Bench", dateOfBirth: "1975-06-01", sexAtBirth: "male", clinicianId: CLINICIAN })
    .returning({ id: patients.id });
  return p!.id;
}

/** A spread of shapes around the whole clock and along the canal, every grade represented. */
function lesionRow(visitId: string, siteId: string, i: number, trackId: string | null = null) {
  const start = (i * 0.37) % 12;
  const width = 0.2 + (i % 5) * 0.3;
  const from = -2 + (i % 9);
  return {
    visitId, siteId, trackId, label: `L${i + 1}`,
    clockStartH: start, clockEndH: (start + width) % 12,
    distanceStartCm: from, distanceEndCm: from + 0.5 + (i % 3) * 0.5,
    zone: "transformation_zone" as const, grade: GRADES[i % GRADES.length]!,
  };
}

async function main() {
  const [site] = await db.select({ id: sites.id }).from(sites).where(eq(sites.code, "HBR"));
  if (!site) throw new Error("Demo site HBR missing: seed the bench database first");
  const siteId = site.id;

  // Map: one draft visit of the demo clinician with 200 lesions.
  const mapPatient = await benchPatient(siteId, "BENCH-MAP", "Mapbench");
  const [mapVisit] = await db.insert(visits).values({ patientId: mapPatient, siteId, visitDate: "2026-01-15", examinerId: CLINICIAN }).returning({ id: visits.id });
  await db.insert(lesions).values(Array.from({ length: 200 }, (_, i) => lesionRow(mapVisit!.id, siteId, i)));

  // Timeline: 30 signed visits × 40 lesions on 40 tracks, statuses computed as the app does.
  const tlPatient = await benchPatient(siteId, "BENCH-TL", "Timelinebench");
  const tracks = await db.insert(lesionTracks).values(Array.from({ length: 40 }, (_, i) => ({ patientId: tlPatient, siteId, label: trackLabel(i + 1) }))).returning({ id: lesionTracks.id });
  const tlVisits = await db
    .insert(visits)
    .values(Array.from({ length: 30 }, (_, i) => ({ patientId: tlPatient, siteId, visitDate: `${2011 + Math.floor(i / 3)}-${String((i % 3) * 4 + 1).padStart(2, "0")}-10`, examinerId: CLINICIAN, status: "signed" as const })))
    .returning({ id: visits.id });
  await db.insert(lesions).values(tlVisits.flatMap((v) => tracks.map((t, i) => lesionRow(v.id, siteId, i, t.id))));
  await refreshTrackStatuses(db, tlPatient, siteId);

  // Load test: draft visits, each with one lesion to start from.
  const slots: { visitId: string; patientId: string; lesionId: string }[] = [];
  for (let s = 0; s < SLOTS; s++) {
    const patientId = await benchPatient(siteId, `BENCH-LOAD-${s}`, `Loadbench${s}`);
    const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: "2026-02-01", examinerId: CLINICIAN }).returning({ id: visits.id });
    const [l] = await db.insert(lesions).values(lesionRow(v!.id, siteId, s)).returning({ id: lesions.id });
    slots.push({ visitId: v!.id, patientId, lesionId: l!.id });
  }
  // Timelines opened in the load mix: the demo scenario's own patients (a clinic's usual sizes).
  const demoPatients = await db
    .select({ id: patients.id })
    .from(patients)
    .where(and(eq(patients.siteId, siteId)));
  const demo = demoPatients.map((p) => p.id).filter((id) => ![mapPatient, tlPatient, ...slots.map((s) => s.patientId)].includes(id));

  const session = await createSession(CLINICIAN);
  console.log(JSON.stringify({
    cookie: `${SESSION_COOKIE}=${session}`,
    siteId,
    map: { patientId: mapPatient, visitId: mapVisit!.id },
    timeline: { patientId: tlPatient },
    slots,
    demoPatients: demo.slice(0, 20),
  }));
}

runScript(main);
