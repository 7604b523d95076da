// Research reads from a streaming replica: scripts/test.sh starts a hot standby of the test cluster
// (pg_basebackup -R) and exports DENTATE_TEST_REPLICA_PORT and DENTATE_TEST_REPLICA_SOCKET. With its
// replay paused (pg_wal_replay_pause(), PostgreSQL 15 manual, "Recovery Control Functions"), a
// write on the primary is invisible there, so an export, the dashboard and a FHIR bundle that do
// not show it read the replica; resumed, they show it. Every wait below is bounded.
import postgres from "postgres";
import { parse } from "csv-parse/sync";
import { and, eq, sql as dsql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { db } from "@/db/client";
import * as s from "@/db/schema";
import { endReplica } from "@/db/replica";
import { loadQualityVisits } from "@/db/queries/research/quality";
import { loadRegistryDashboard } from "@/lib/server/research";
import { refreshStudyFigures } from "@/lib/server/study-figures";
import { GET as getCsv } from "@/app/api/exports/[dataset]/route";
import { GET as subjectFhir } from "@/app/api/studies/[studyId]/subjects/[subjectId]/fhir/route";
import { actor, ctx, makePatient, makeSite, req, type Actor } from "../fixtures/factory";

const REPLICA_PORT = process.env.DENTATE_TEST_REPLICA_PORT;
const REPLICA_SOCKET = process.env.DENTATE_TEST_REPLICA_SOCKET;
const DATABASE_URL = process.env.DATABASE_URL!;

let siteId: string, studyId: string, patientId: string;
let nurse: Actor, clinician: Actor;
let standby: postgres.Sql; // the replica, as its superuser over its private socket
const dbName = new URL(DATABASE_URL).pathname.slice(1);

async function until(what: string, ok: () => Promise<boolean>, ms = 10_000): Promise<void> {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (await ok()) return;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`timed out after ${ms} ms waiting until ${what}`);
}

async function replicaVisits(): Promise<number> {
  const [r] = await standby<{ n: number }[]>`SELECT count(*)::int AS n FROM visits WHERE patient_id = ${patientId}`;
  return r!.n;
}

async function addSignedVisit(date: string): Promise<void> {
  await db.insert(s.visits).values({ patientId, siteId, visitDate: date, examinerId: clinician.userId, status: "signed", signedAt: new Date() });
}

async function exportedVisits(): Promise<number> {
  const res = await getCsv(req("GET", `/api/exports/counts?studyId=${studyId}`, nurse), ctx({ dataset: "counts" }));
  expect(res.status).toBe(200);
  return (parse(await res.text(), { columns: true }) as unknown[]).length;
}

async function pause(): Promise<void> {
  await standby`SELECT pg_wal_replay_pause()`;
  await until("replay is paused", async () => (await standby<{ s: string }[]>`SELECT pg_get_wal_replay_pause_state() AS s`)[0]!.s === "paused");
}

beforeAll(async () => {
  if (!REPLICA_PORT || !REPLICA_SOCKET) throw new Error("no replica: run through scripts/test.sh, or DENTATE_TEST_REPLICA=1 scripts/test-db.sh");
  standby = postgres({ host: REPLICA_SOCKET, port: Number(REPLICA_PORT), database: dbName, username: "postgres", max: 1, onnotice: () => {} });
  const url = new URL(DATABASE_URL);
  url.port = REPLICA_PORT;
  process.env.DATABASE_REPLICA_URL = url.toString();
  process.env.DATABASE_REPLICA_CHECK_MS = "0";
  process.env.DATABASE_REPLICA_MAX_LAG_S = "600";

  siteId = (await makeSite("Replica")).id;
  nurse = await actor("research_nurse", [siteId]);
  clinician = await actor("clinician", [siteId]);
  const [study] = await db.insert(s.studies).values({ code: `R-${siteId.slice(0, 6)}`, title: "Invented replica study", startDate: "2024-01-01" }).returning();
  studyId = study!.id;
  await db.insert(s.studySites).values({ studyId, siteId });
  patientId = (await makePatient(siteId, { consentResearch: true })).id;
  await db.insert(s.enrolments).values({ studyId, patientId, siteId, studySubjectId: "REP-001", consentDate: "2024-01-01" });
  await addSignedVisit("2024-02-01");
  await until("the replica has the first visit", async () => (await replicaVisits()) === 1);
});

afterAll(async () => {
  delete process.env.DATABASE_REPLICA_URL;
  await standby`SELECT pg_wal_replay_resume()`.catch(() => {});
  await endReplica();
  await standby?.end();
});

describe("research reads with DATABASE_REPLICA_URL set", () => {
  it("export, dashboard, quality panel and FHIR bundle read the replica; the write and the export's audit row go to the primary", async () => {
    await pause();
    await addSignedVisit("2024-05-01");
    const [{ n } = { n: 0 }] = await db.select({ n: dsql<number>`count(*)::int` }).from(s.visits).where(eq(s.visits.patientId, patientId));
    expect(n).toBe(2); // the primary has the new visit
    expect(await exportedVisits()).toBe(1); // the replica's state: only the first
    // The dashboard's first load works its figures out (from the replica) and stores them on the primary.
    expect((await loadRegistryDashboard(studyId, [siteId])).visits).toBe(1);
    expect(await loadQualityVisits({ userId: nurse.userId, siteIds: [siteId] }, 2024)).toHaveLength(1); // the quality panel's rows
    const fhir = await subjectFhir(req("GET", `/api/studies/${studyId}/subjects/REP-001/fhir`, nurse), ctx({ studyId, subjectId: "REP-001" }));
    const bundle = (await fhir.json()) as { entry: { resource: { resourceType: string } }[] };
    expect(bundle.entry.filter((e) => e.resource.resourceType === "Encounter")).toHaveLength(1);

    // The export's audit row was written (on the primary) although the replica is frozen.
    const audited = () => db.select({ id: s.auditEvents.id }).from(s.auditEvents).where(and(eq(s.auditEvents.userId, nurse.userId), eq(s.auditEvents.action, "export.deidentified")));
    await until("the export is audited on the primary", async () => (await audited()).length > 0);
    const [onReplica] = await standby<{ n: number }[]>`SELECT count(*)::int AS n FROM audit_events WHERE user_id = ${nurse.userId}`;
    expect(onReplica!.n).toBe(0);

    await standby`SELECT pg_wal_replay_resume()`;
    await until("the replica has replayed the second visit", async () => (await replicaVisits()) === 2);
    expect(await exportedVisits()).toBe(2);
    await refreshStudyFigures(studyId, [siteId]); // what a load over the figures' age starts
    expect((await loadRegistryDashboard(studyId, [siteId])).visits).toBe(2);
    expect(await loadQualityVisits({ userId: nurse.userId, siteIds: [siteId] }, 2024)).toHaveLength(2);
  });

  it("falls back to the primary with a log line when the replica lags beyond the limit", async () => {
    const warn = vi.spyOn(console, "warn").mockImplementation(() => {});
    try {
      await pause();
      await addSignedVisit("2024-08-01");
      await until("the replica has received what it has not replayed", async () => {
        const [r] = await standby<{ behind: boolean }[]>`SELECT pg_last_wal_receive_lsn() > pg_last_wal_replay_lsn() AS behind`;
        return r!.behind;
      });
      await new Promise((r) => setTimeout(r, 1_100));
      process.env.DATABASE_REPLICA_MAX_LAG_S = "1";
      expect(await exportedVisits()).toBe(3); // the primary's state
      expect(warn.mock.calls.some((c) => /research reads use the primary: the replica lags/.test(String(c[0])))).toBe(true);
    } finally {
      process.env.DATABASE_REPLICA_MAX_LAG_S = "600";
      warn.mockRestore();
      await standby`SELECT pg_wal_replay_resume()`;
    }
  });

  it("falls back to the primary with a log line when the replica is unreachable", async () => {
    const warn = vi.spyOn(console, "warn").mockImplementation(() => {});
    const url = process.env.DATABASE_REPLICA_URL!;
    try {
      await pause(); // the real replica is frozen at three visits; a fourth is only on the primary
      await addSignedVisit("2024-11-01");
      const down = new URL(url);
      down.port = "1"; // nothing listens there
      process.env.DATABASE_REPLICA_URL = down.toString();
      expect(await exportedVisits()).toBe(4);
      expect(warn.mock.calls.some((c) => /research reads use the primary: the replica is unreachable/.test(String(c[0])))).toBe(true);
    } finally {
      process.env.DATABASE_REPLICA_URL = url;
      warn.mockRestore();
      await standby`SELECT pg_wal_replay_resume()`;
    }
  });
});
