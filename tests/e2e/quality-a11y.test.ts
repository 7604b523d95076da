// Accessibility: axe-core (Deque's WCAG 2.x rule engine) runs in Chromium on every main page for
// each demo role; no violation of impact "serious" or "critical" is allowed. The impact levels are
// axe-core's own (https://github.com/dequelabs/axe-core/blob/develop/doc/rule-descriptions.md).
// Pages are found by following the app's own links and APIs, so a page that disappears or stops
// rendering fails here too.
import AxeBuilder from "@axe-core/playwright";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { BASE_URL, launch, signIn } from "./browser";

type Role = "clinician" | "reviewer" | "admin" | "research_nurse";
const EMAIL: Record<Role, string> = {
  clinician: "clinician@dentate.example",
  reviewer: "reviewer@dentate.example",
  admin: "admin@dentate.example",
  research_nurse: "nurse@dentate.example",
};

let browser: BrowserContext;
let patientId = "";
let draftVisitId = "";
let studyPath: string | null = null;

interface Finding {
  page: string;
  rule: string;
  impact: string;
  help: string;
  targets: string[];
}

async function audit(page: Page, label: string): Promise<Finding[]> {
  // Client components hydrate and fetch after load; give them a moment to settle.
  await page.waitForLoadState("load");
  await page.waitForTimeout(500);
  const result = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa", "best-practice"]).analyze();
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => ({ page: label, rule: v.id, impact: v.impact!, help: v.help, targets: v.nodes.slice(0, 5).map((n) => n.target.join(" ")) }));
}

async function visit(page: Page, path: string): Promise<void> {
  const res = await page.goto(`${BASE_URL}${path}`);
  expect(res?.status(), path).toBeLessThan(400);
  expect(new URL(page.url()).pathname, `${path} redirected`).toBe(path.split("?")[0]);
}

async function asRole(role: Role): Promise<Page> {
  await browser.clearCookies();
  const page = await browser.newPage();
  await signIn(page, EMAIL[role]);
  return page;
}

beforeAll(async () => {
  browser = await launch({ width: 1280, height: 900 });
  // A draft visit with a lesion, so the map editor is audited with its editing controls.
  const page = await asRole("clinician");
  const { rows } = await (await page.request.get(`${BASE_URL}/api/patients`)).json();
  patientId = rows[0].id;
  const created = await page.request.post(`${BASE_URL}/api/patients/${patientId}/visits`, {
    headers: { origin: BASE_URL },
    data: { visitDate: "2026-06-03", patientPosition: "lithotomy", indication: "Surveillance" },
  });
  expect(created.status()).toBe(201);
  draftVisitId = (await created.json()).visit.id;
  const lesion = await page.request.post(`${BASE_URL}/api/visits/${draftVisitId}/lesions`, {
    headers: { origin: BASE_URL },
    data: { clockStartH: 1, clockEndH: 2.5, distanceStartCm: 0.5, distanceEndCm: 1.5, grade: "hsil" },
  });
  expect(lesion.status()).toBe(201);
  await page.close();
  const nurse = await asRole("research_nurse");
  await nurse.goto(`${BASE_URL}/studies`);
  studyPath = await nurse.locator('main a[href^="/studies/"]').first().getAttribute("href", { timeout: 5_000 }).catch(() => null);
  await nurse.close();
});
afterAll(async () => {
  await browser?.close();
});

// Page keys per role; the ids are resolved once the demo records are known (beforeAll).
const PAGES: Record<Role, string[]> = {
  clinician: ["/patients", "patient", "visit", "timeline", "compare", "/worklist", "/biopsies", "/patients/import"],
  reviewer: ["/patients", "patient", "visit", "timeline", "compare", "/worklist", "/quality"],
  admin: ["/patients", "patient", "/biopsies", "/staff", "/audit", "/followup-rules", "/studies", "study", "/quality"],
  research_nurse: ["/studies", "study"],
};
function resolvePath(key: string): string | null {
  const patient = `/patients/${patientId}`;
  if (key === "patient") return patient;
  if (key === "visit") return `${patient}/visits/${draftVisitId}`;
  if (key === "timeline" || key === "compare") return `${patient}/${key}`;
  if (key === "study") return studyPath;
  return key;
}

function report(findings: Finding[]): string {
  return findings.map((f) => `${f.page}: [${f.impact}] ${f.rule} – ${f.help}\n    ${f.targets.join("\n    ")}`).join("\n");
}

describe("no serious or critical accessibility violations", () => {
  it("sign-in and password pages (no session)", async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    const findings: Finding[] = [];
    for (const path of ["/sign-in", "/forgot-password"]) {
      await visit(page, path);
      findings.push(...(await audit(page, path)));
    }
    // The form's error state is part of the page too.
    await page.goto(`${BASE_URL}/sign-in`);
    await page.getByLabel("E-mail").fill("clinician@dentate.example");
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.locator("form [role=alert]").waitFor();
    findings.push(...(await audit(page, "/sign-in (error)")));
    await page.close();
    expect(findings, report(findings)).toEqual([]);
  });

  const pages: Partial<Record<Role, Page>> = {};
  afterAll(async () => {
    for (const p of Object.values(pages)) await p?.close().catch(() => {});
  });
  for (const role of ["clinician", "reviewer", "admin", "research_nurse"] as const) {
    for (const key of PAGES[role]) {
      it(`${role}: ${key}`, async () => {
        const path = resolvePath(key);
        expect(path, `${key} could not be found from the app's own links`).not.toBeNull();
        // One signed-in tab per role, reused for that role's pages.
        if (!pages[role]) {
          for (const p of Object.values(pages)) await p?.close().catch(() => {});
          for (const k of Object.keys(pages)) delete pages[k as Role];
          pages[role] = await asRole(role);
        }
        const page = pages[role]!;
        await visit(page, path!);
        const findings = await audit(page, `${role} ${path}`);
        expect(findings, report(findings)).toEqual([]);
      }, 45_000);
    }
  }
});
