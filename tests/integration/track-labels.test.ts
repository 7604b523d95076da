import { readFileSync } from "node:fs";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, sql } from "@/db/client";
import { lesionTracks, visits } from "@/db/schema";
import { POST } from "@/app/api/visits/[visitId]/lesions/route";
import { nextTrackLabel } from "@/lib/domain/track-label";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

// Track labels are "#1", "#2"… (lib/domain/track-label.ts is the spec); the SQL that numbers a new
// lesion's track in db/queries/lesions.ts must agree with it on the same cases.
let siteId: string, clinician: Actor;
const body = { clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, grade: "hsil" };

async function newVisit() {
  const patientId = (await makePatient(siteId)).id;
  const [v] = await db.insert(visits).values({ patientId, siteId, visitDate: "2026-03-01", examinerId: clinician.userId }).returning();
  return { patientId, visitId: v!.id };
}
async function addLesion(visitId: string) {
  const res = await POST(req("POST", `/api/visits/${visitId}/lesions`, clinician, body), ctx({ visitId }));
  expect(res.status).toBe(201);
  const { lesion } = await res.json();
  const [t] = await db.select({ label: lesionTracks.label }).from(lesionTracks).where(eq(lesionTracks.id, lesion.trackId));
  return t!.label;
}

beforeAll(async () => {
  siteId = (await makeSite()).id;
  clinician = await actor("clinician", [siteId]);
});

describe("track labels", () => {
  it("labels a patient's first tracks #1 and #2, never T1", async () => {
    const { visitId } = await newVisit();
    expect(await addLesion(visitId)).toBe("#1");
    expect(await addLesion(visitId)).toBe("#2");
  });

  it("numbers a new track as the TypeScript rule does, after a gap and beside a label of another form", async () => {
    const { patientId, visitId } = await newVisit();
    const existing = ["#1", "#3", "T7"];
    await db.insert(lesionTracks).values(existing.map((label) => ({ patientId, siteId, label })));
    expect(await addLesion(visitId)).toBe(nextTrackLabel(existing));
  });

  it("the migration turns stored T labels into # labels with the same number", async () => {
    const { patientId } = await newVisit();
    await db.insert(lesionTracks).values([{ patientId, siteId, label: "T1" }, { patientId, siteId, label: "T12" }]);
    // The migration's own statement, narrowed to this patient: other test files running at the same
    // time hold patients with both label forms, which the whole-table run would make collide.
    const migration = readFileSync(join(process.cwd(), "db/migrations/0013_track_labels_hash.sql"), "utf8");
    expect(migration).toContain('WHERE "label" ~');
    await sql.unsafe(migration.replace('WHERE "label" ~', `WHERE "patient_id" = '${patientId}' AND "label" ~`));
    const rows = await db.select({ label: lesionTracks.label }).from(lesionTracks).where(eq(lesionTracks.patientId, patientId));
    expect(rows.map((r) => r.label).sort()).toEqual(["#1", "#12"]);
  });
});
