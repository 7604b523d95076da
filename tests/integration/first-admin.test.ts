// An empty install: the first administrator's command against a database of its own (migrated,
// no demo), the refusal once an administrator exists, and a production server's refusal to serve
// a database that holds the demo accounts (the shared test database does).
import { execFileSync, spawnSync } from "node:child_process";
import path from "node:path";
import postgres from "postgres";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { GET as listLesions } from "@/app/api/visits/[visitId]/lesions/route";
import { servableRefusal } from "@/lib/auth/servable";
import { actor, ctx, makeSite, req } from "../fixtures/factory";
import { dropTestDatabase } from "../support/drop-database";

const ROOT = path.resolve(__dirname, "../..");
const EMPTY_DB = `dentate_empty_${process.pid}_${Date.now() % 1_000_000}`;
const urlFor = (db: string) => {
  const u = new URL(process.env.DATABASE_URL!);
  u.pathname = `/${db}`;
  return u.toString();
};
const tsx = path.join(ROOT, "node_modules/.bin/tsx");
const run = (script: string, args: string[], env: Record<string, string>) =>
  spawnSync(tsx, ["--conditions=react-server", script, ...args], { cwd: ROOT, env: { ...process.env, ...env }, encoding: "utf8", timeout: 60_000 });

let admin: postgres.Sql;
let empty: postgres.Sql;
beforeAll(async () => {
  admin = postgres(urlFor("postgres"), { max: 1, onnotice: () => {} });
  await admin.unsafe(`create database ${EMPTY_DB}`);
  execFileSync(tsx, ["db/migrate.ts"], { cwd: ROOT, env: { ...process.env, DATABASE_URL: urlFor(EMPTY_DB) }, stdio: "pipe" });
  empty = postgres(urlFor(EMPTY_DB), { max: 1, onnotice: () => {} });
}, 120_000);
afterAll(async () => {
  await empty?.end();
  if (admin) await dropTestDatabase(admin, EMPTY_DB);
  await admin?.end();
});

describe("npm run admin:create on an empty install", () => {
  const env = () => ({ DATABASE_URL: urlFor(EMPTY_DB), APP_BASE_URL: "https://dentate.clinic.example" });

  it("starts with no account at all", async () => {
    expect((await empty`select count(*)::int as n from users`)[0]!.n).toBe(0);
  });

  it("creates the site, queues the invitation mail and prints the one-time link", async () => {
    const r = run("scripts/admin-create.ts", ["--email", "Lead@Riverside.example", "--site", "Riverside Anal Health Clinic"], env());
    expect(r.status, r.stderr).toBe(0);
    const link = r.stdout.match(/https:\/\/dentate\.clinic\.example\/accept-invite\/\S+/)?.[0];
    expect(link).toBeDefined();
    const [site] = await empty`select code, name from sites`;
    expect(site).toEqual({ code: "RAHC", name: "Riverside Anal Health Clinic" });
    const invites = await empty`select email, role, invited_by, used_at, revoked_at from invitations`;
    expect(invites).toEqual([{ email: "lead@riverside.example", role: "admin", invited_by: null, used_at: null, revoked_at: null }]);
    const [mail] = await empty`select to_address, text_body from mail_outbox`;
    expect(mail!.to_address).toBe("lead@riverside.example");
    expect(mail!.text_body).toContain(link!);
    const [audit] = await empty`select action from audit_events where action = 'invitation.first_admin'`;
    expect(audit).toBeDefined();
  });

  it("run again before the link is used: the earlier link is revoked, one link stays open", async () => {
    const r = run("scripts/admin-create.ts", ["--email", "lead@riverside.example", "--site", "Riverside Anal Health Clinic"], env());
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toContain("1 earlier set-up link(s) revoked");
    const open = await empty`select count(*)::int as n from invitations where revoked_at is null`;
    expect(open[0]!.n).toBe(1);
    expect((await empty`select count(*)::int as n from sites`)[0]!.n).toBe(1);
  });

  it("refuses bad input with the field named, and writes nothing", async () => {
    const before = (await empty`select count(*)::int as n from invitations`)[0]!.n;
    const r = run("scripts/admin-create.ts", ["--email", "nobody", "--site", "X"], env());
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/--email: .*--site: /s);
    expect((await empty`select count(*)::int as n from invitations`)[0]!.n).toBe(before);
  });

  it("refuses once an active administrator exists", async () => {
    await empty`insert into users (id, email, display_name, role) values ('u-first', 'lead@riverside.example', 'Lead', 'admin')`;
    const r = run("scripts/admin-create.ts", ["--email", "other@riverside.example", "--site", "Riverside Anal Health Clinic"], env());
    expect(r.status).toBe(3);
    expect(r.stderr).toContain("An administrator already exists");
    expect((await empty`select count(*)::int as n from invitations where email = 'other@riverside.example'`)[0]!.n).toBe(0);
  });
});

describe("a production server and the demo accounts", () => {
  // scripts/test.sh declares its (demo) database a demonstration install: DENTATE_DEMO=1.
  const saved = { NODE_ENV: process.env.NODE_ENV, DENTATE_DEMO: process.env.DENTATE_DEMO };
  afterEach(() => {
    Object.assign(process.env, saved);
    if (saved.DENTATE_DEMO === undefined) delete process.env.DENTATE_DEMO;
  });

  it("the start-up check refuses the demo database in production and passes an empty one", () => {
    const demo = run("scripts/preflight.ts", [], { DENTATE_DEMO: "" });
    expect(demo.status).toBe(1);
    expect(demo.stderr).toMatch(/demo accounts whose password is published/);
    expect(run("scripts/preflight.ts", [], { DENTATE_DEMO: "1" }).status).toBe(0);
    expect(run("scripts/preflight.ts", [], { DENTATE_DEMO: "", DATABASE_URL: urlFor(EMPTY_DB) }).status).toBe(0);
  });

  it("a running production server answers 503 with the reason instead of patient data", async () => {
    expect(await servableRefusal({ NODE_ENV: "production" })).toMatch(/6 demo accounts/);
    const clinician = await actor("clinician", [(await makeSite()).id]);
    Object.assign(process.env, { NODE_ENV: "production", DENTATE_DEMO: "" });
    const res = await listLesions(req("GET", "/api/visits/00000000-0000-4000-8000-000000000000/lesions", clinician), ctx({ visitId: "00000000-0000-4000-8000-000000000000" }));
    expect(res.status).toBe(503);
    expect((await res.json()).error.message).toMatch(/demo account/);
  });
});
