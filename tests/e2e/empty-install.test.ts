// An empty install, as a clinic adopts Dentate: its own database (migrated, no demo), its own
// `next start` and mail worker beside the ones scripts/test.sh runs, and the fake inbox. The first
// administrator comes from the documented command, signs in, adds a site and invites a clinician;
// the clinician registers a patient, starts a visit and places a lesion; the same MRN again is
// refused, and an edit from a stale version is a 409.
import { execFileSync, spawn, spawnSync, type ChildProcess } from "node:child_process";
import path from "node:path";
import postgres from "postgres";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { BASE_URL, launch, mapPoint, screenshot } from "./browser";
import { dropTestDatabase } from "../support/drop-database";

const ROOT = path.resolve(__dirname, "../..");
const PORT = Number(new URL(BASE_URL).port || 80) + 20;
const URL_ = `http://127.0.0.1:${PORT}`;
const INBOX = `${process.env.MAILDEV_WEB_URL ?? "http://127.0.0.1:1080"}/api/email`;
const DB = `dentate_e2e_empty_${process.pid}`;
const dbUrl = (name: string) => Object.assign(new URL(process.env.DATABASE_URL!), { pathname: `/${name}` }).toString();
const env = () => ({ ...process.env, DATABASE_URL: dbUrl(DB), APP_BASE_URL: URL_, DENTATE_DEMO: "", NEXT_TELEMETRY_DISABLED: "1", MAIL_WORKER_INTERVAL_MS: "300", NODE_OPTIONS: "--require=./scripts/peer-address.cjs" });
const stamp = Date.now();
const ADMIN = `lead-${stamp}@riverside.example`;
const CLINICIAN = `np-${stamp}@riverside.example`;

const children: ChildProcess[] = [];
let admin: postgres.Sql;
let browser: BrowserContext;

function start(cmd: string, args: string[]) {
  const child = spawn(path.join(ROOT, "node_modules/.bin", cmd), args, { cwd: ROOT, env: env(), stdio: "ignore", detached: true });
  children.push(child);
}

async function waitForMail(to: string): Promise<string> {
  const end = Date.now() + 30_000;
  while (Date.now() < end) {
    const mails = (await (await fetch(INBOX)).json()) as { text: string; to: { address: string }[] }[];
    const hit = mails.find((m) => m.to.some((t) => t.address === to));
    if (hit) return hit.text;
    await new Promise((r) => setTimeout(r, 400));
  }
  throw new Error(`no mail to ${to}`);
}

async function acceptInvitation(page: Page, mailText: string, name: string, password: string) {
  const link = /https?:\/\/\S+\/accept-invite\/[A-Za-z0-9_-]{43}/.exec(mailText)![0];
  await page.goto(`${URL_}${new URL(link).pathname}`);
  await page.getByLabel("Your name").fill(name);
  await page.getByLabel("New password").fill(password);
  await page.getByRole("button", { name: "Set password" }).click();
  await page.waitForURL((u) => u.pathname === "/sign-in");
}

async function signInHere(page: Page, email: string, password: string) {
  await page.goto(`${URL_}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => u.pathname !== "/sign-in" && u.pathname !== "/");
}

beforeAll(async () => {
  admin = postgres(dbUrl("postgres"), { max: 1, onnotice: () => {} });
  await admin.unsafe(`drop database if exists ${DB} with (force)`);
  await admin.unsafe(`create database ${DB}`);
  execFileSync(path.join(ROOT, "node_modules/.bin/tsx"), ["db/migrate.ts"], { cwd: ROOT, env: env(), stdio: "pipe" });
  start("next", ["start", "-H", "127.0.0.1", "-p", String(PORT)]);
  start("tsx", ["--conditions=react-server", "scripts/mail-worker.ts"]);
  const end = Date.now() + 60_000;
  for (;;) {
    // The server must be ours: one that exited (a port taken by another process) fails here.
    if (children[0]!.exitCode != null) throw new Error(`the empty install's server exited (port ${PORT} taken?)`);
    try {
      if ((await fetch(`${URL_}/sign-in`)).status < 500) break;
    } catch {}
    if (Date.now() > end) throw new Error("the empty install did not start");
    await new Promise((r) => setTimeout(r, 300));
  }
  browser = await launch({ width: 1280, height: 900 });
}, 120_000);

afterAll(async () => {
  await browser?.close();
  for (const c of children) {
    try {
      process.kill(-c.pid!, "SIGTERM");
    } catch {}
  }
  await new Promise((r) => setTimeout(r, 1_000));
  if (admin) await dropTestDatabase(admin, DB);
  await admin?.end();
});

describe("a clinic starts from an empty install", () => {
  it("first administrator by command, a site, an invited clinician, a registered patient with a mapped lesion", async () => {
    // No account exists: the sign-in page works, nobody can sign in.
    const counts = postgres(dbUrl(DB), { max: 1, onnotice: () => {} });
    expect((await counts`select count(*)::int as n from users`)[0]!.n).toBe(0);

    const cmd = spawnSync(path.join(ROOT, "node_modules/.bin/tsx"), ["--conditions=react-server", "scripts/admin-create.ts", "--email", ADMIN, "--site", "Riverside Anal Health Clinic"], { cwd: ROOT, env: env(), encoding: "utf8" });
    expect(cmd.status, cmd.stderr).toBe(0);
    const printed = /https?:\/\/\S+\/accept-invite\/\S+/.exec(cmd.stdout)![0];
    const mailed = await waitForMail(ADMIN);
    expect(mailed).toContain(printed);

    const page = await browser.newPage();
    await acceptInvitation(page, mailed, "Jordan Lead", "heron lantern quarry basin");
    await signInHere(page, ADMIN, "heron lantern quarry basin");

    // A second site, then a clinician invited to the first.
    await page.goto(`${URL_}/sites`);
    const newSite = page.getByRole("form", { name: "New site" });
    await newSite.getByLabel("Site name").fill("Riverside Satellite Clinic");
    await newSite.getByLabel("Short code").fill("RSC");
    await newSite.getByLabel("Time zone").fill("America/Chicago");
    await newSite.getByRole("button", { name: "Create site" }).click();
    await page.getByText("Site RSC created").waitFor();
    await screenshot(page, "empty-install-sites");

    await page.goto(`${URL_}/staff`);
    const invite = page.locator("form").filter({ has: page.getByRole("button", { name: "Send invitation" }) });
    await invite.getByLabel("E-mail").fill(CLINICIAN);
    await invite.getByLabel("Site").selectOption({ label: "Riverside Anal Health Clinic" });
    await invite.getByLabel("Role").selectOption("clinician");
    await invite.getByRole("button", { name: "Send invitation" }).click();
    await page.getByText(`Invitation sent to ${CLINICIAN}`).waitFor();

    await browser.clearCookies();
    const np = await browser.newPage();
    await acceptInvitation(np, await waitForMail(CLINICIAN), "Casey Rowan, NP", "otter meadow lantern keel");
    await signInHere(np, CLINICIAN, "otter meadow lantern keel");

    // The clinician registers the clinic's first patient.
    await np.goto(`${URL_}/patients`);
    await np.getByRole("link", { name: "Register a patient" }).click();
    const form = np.getByRole("form", { name: "Register a patient" });
    await form.getByLabel("Family name").fill("Okonkwo-Hale");
    await form.getByLabel("Given name").fill("Avery");
    await form.getByLabel("Date of birth").fill("1979-04-12");
    await form.getByLabel("Sex at birth").selectOption("male");
    await form.getByLabel("Medical record number").fill("RV-000101");
    await form.getByRole("button", { name: "Register patient" }).click();
    await np.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    const patientId = np.url().split("/").pop()!;

    // A visit and a lesion placed on the map.
    await np.getByRole("button", { name: "Start visit" }).click();
    await np.waitForURL(/\/visits\/[0-9a-f-]{36}$/);
    await np.getByRole("radio", { name: "Lithotomy" }).click();
    const p3 = await mapPoint(np, 3, 2);
    await np.mouse.click(p3.x, p3.y);
    await expect.poll(async () => (await counts`select count(*)::int as n from lesions`)[0]!.n, { timeout: 15_000 }).toBe(1);
    await screenshot(np, "empty-install-first-lesion");

    // The same MRN at the same site is refused, with the existing patient named.
    const again = await np.request.post(`${URL_}/api/patients`, {
      headers: { origin: URL_ },
      data: { siteId: (await counts`select site_id from patients`)[0]!.site_id, familyName: "Other", givenName: "Person", dateOfBirth: "1990-01-01", sexAtBirth: "female", mrn: "RV-000101", hivStatus: "unknown", riskGroups: [] },
    });
    expect(again.status()).toBe(409);
    expect(await again.text()).toContain(patientId);

    // An edit from a stale version is refused.
    const [{ version }] = await counts`select version from patients where id = ${patientId}`;
    const edit = (v: number, givenName: string) => np.request.patch(`${URL_}/api/patients/${patientId}`, { headers: { origin: URL_ }, data: { version: v, givenName } });
    expect((await edit(version, "Avery J.")).status()).toBe(200);
    expect((await edit(version, "Avery K.")).status()).toBe(409);
    await counts.end();
  });
});
