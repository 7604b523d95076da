// Security headers and the Content-Security-Policy against the running app: every main page of
// each demo role answers with the headers, and Chromium reports no CSP violation while the pages
// load and hydrate (a blocked script would leave a page dead). Also: a session past its absolute
// lifetime leads to the sign-in page, which says why.
// Sources (from memory): OWASP HTTP Headers Cheat Sheet; MDN "Content-Security-Policy";
// OWASP Session Management Cheat Sheet, "Absolute Timeout".
import postgres from "postgres";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page, Response } from "playwright-core";
import { BASE_URL, launch, signIn } from "./browser";

type Role = "clinician" | "reviewer" | "admin" | "research_nurse";
const EMAIL: Record<Role, string> = {
  clinician: "clinician@dentate.example",
  reviewer: "reviewer@dentate.example",
  admin: "admin@dentate.example",
  research_nurse: "nurse@dentate.example",
};
const PAGES: Record<Role, string[]> = {
  clinician: ["/patients", "patient", "timeline", "compare", "/worklist", "/biopsies", "/patients/import"],
  reviewer: ["/patients", "patient", "/worklist", "/quality"],
  admin: ["/staff", "/audit", "/followup-rules", "/studies", "/quality"],
  research_nurse: ["/studies"],
};

let browser: BrowserContext;
let patientId = "";

function headerProblems(res: Response | null, label: string): string[] {
  if (!res) return [`${label}: no response`];
  const h = res.headers();
  const out: string[] = [];
  const csp = h["content-security-policy"] ?? "";
  if (!/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/.test(csp)) out.push(`${label}: script-src without a nonce (${csp})`);
  if (!csp.includes("frame-ancestors 'none'")) out.push(`${label}: frame-ancestors`);
  if (h["x-frame-options"] !== "DENY") out.push(`${label}: x-frame-options`);
  if (h["x-content-type-options"] !== "nosniff") out.push(`${label}: nosniff`);
  if (h["referrer-policy"] !== "same-origin") out.push(`${label}: referrer-policy`);
  if (!/camera=\(\)/.test(h["permissions-policy"] ?? "")) out.push(`${label}: permissions-policy`);
  return out;
}

/** Console messages Chromium writes when the policy blocks something. */
function watchCsp(page: Page, into: string[]) {
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to (execute|load|apply|connect|frame)/i.test(m.text())) into.push(`${page.url()}: ${m.text()}`);
  });
}

beforeAll(async () => {
  browser = await launch();
  const page = await browser.newPage();
  await signIn(page, EMAIL.clinician);
  patientId = (await (await page.request.get(`${BASE_URL}/api/patients`)).json()).rows[0].id;
  await page.close();
});
afterAll(async () => {
  await browser?.close();
});

describe("security headers and CSP on the main pages", () => {
  it("sign-in: headers on the page and on the server action's answer, no CSP violation", async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    const violations: string[] = [];
    watchCsp(page, violations);
    const problems = headerProblems(await page.goto(`${BASE_URL}/sign-in`), "/sign-in");
    const action = page.waitForResponse((r) => r.request().method() === "POST" && new URL(r.url()).pathname === "/sign-in");
    await page.getByLabel("E-mail").fill(EMAIL.clinician);
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    problems.push(...headerProblems(await action, "sign-in action").filter((p) => !p.includes("script-src")));
    await page.locator("form [role=alert]").waitFor();
    await page.close();
    expect(problems).toEqual([]);
    expect(violations).toEqual([]);
  });

  for (const role of Object.keys(PAGES) as Role[]) {
    it(`${role}: every main page has the headers and loads without a CSP violation`, async () => {
      await browser.clearCookies();
      const page = await browser.newPage();
      const violations: string[] = [];
      watchCsp(page, violations);
      await signIn(page, EMAIL[role]);
      const problems: string[] = [];
      for (const key of PAGES[role]) {
        const path = key === "patient" ? `/patients/${patientId}` : key === "timeline" || key === "compare" ? `/patients/${patientId}/${key}` : key;
        const res = await page.goto(`${BASE_URL}${path}`);
        expect(res?.status(), path).toBeLessThan(400);
        problems.push(...headerProblems(res, path));
        await page.waitForLoadState("load");
        await page.waitForTimeout(400); // hydration and the first SWR fetches
      }
      const api = await page.request.get(`${BASE_URL}/api/me/preferences`);
      expect(api.headers()["content-security-policy"]).toMatch(/default-src 'none'/);
      expect(api.headers()["x-frame-options"]).toBe("DENY");
      await page.close();
      expect(problems).toEqual([]);
      expect(violations).toEqual([]);
    });
  }
});

describe("absolute session lifetime", () => {
  it("a session signed in longer ago than the limit leads to the sign-in page, which says the user was signed out after 168 hours", async () => {
    const url = process.env.DATABASE_URL;
    expect(url, "DATABASE_URL (scripts/test.sh sets it)").toBeTruthy();
    await browser.clearCookies();
    const page = await browser.newPage();
    await signIn(page, EMAIL.reviewer);
    const cookie = (await browser.cookies()).find((c) => c.name === "dentate_session")!;
    const sql = postgres(url!, { max: 1 });
    try {
      await sql`update sessions set created_at = now() - interval '7 days 1 minute' where id = ${cookie.value}`;
    } finally {
      await sql.end();
    }
    await page.goto(`${BASE_URL}/patients`);
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await expect(page.getByRole("status").textContent()).resolves.toMatch(/signed out after 168 hours/);
    await page.close();
  });
});
