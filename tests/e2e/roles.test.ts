import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext } from "playwright-core";
import { BASE_URL, launch, screenshot, signIn } from "./browser";

let browser: BrowserContext;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

async function freshPage() {
  await browser.clearCookies();
  return browser.newPage();
}

describe("each demo role signs in and sees what it may open", () => {
  it("sends a visitor without a session to sign-in, and an API call gets 401 JSON", async () => {
    const page = await freshPage();
    await page.goto(`${BASE_URL}/patients`);
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    const res = await page.request.get(`${BASE_URL}/api/patients`);
    expect(res.status()).toBe(401);
    expect((await res.json()).error.code).toBe("unauthenticated");
    await screenshot(page, "sign-in");
    await page.close();
  });

  it("refuses a wrong password with a message and no session", async () => {
    const page = await freshPage();
    await page.goto(`${BASE_URL}/sign-in`);
    await page.getByLabel("E-mail").fill("clinician@dentate.example");
    await page.getByLabel("Password").fill("wrong-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect.poll(() => page.locator("form [role=alert]").textContent()).toContain("do not match");
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await page.close();
  });

  it("clinician: patients list with search, a patient page with visits; no staff page", async () => {
    const page = await freshPage();
    await signIn(page, "clinician@dentate.example");
    expect(new URL(page.url()).pathname).toBe("/patients");
    await expect.poll(() => page.locator("tbody tr").count()).toBeGreaterThan(5);
    await screenshot(page, "patients-clinician");
    const firstName = (await page.locator("tbody tr td a").first().textContent())!;
    const family = firstName.split(",")[0]!;
    await page.getByLabel("Search by name or MRN").fill(family);
    await page.getByRole("button", { name: "Search" }).click();
    await page.waitForURL(/q=/);
    await page.getByRole("link", { name: firstName }).first().click();
    await page.waitForURL(/\/patients\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.getByRole("heading", { name: "Visits" }).count()).toBe(1);
    await screenshot(page, "patient-clinician");
    await page.goto(`${BASE_URL}/staff`);
    expect(new URL(page.url()).pathname).toBe("/no-access");
    await page.close();
  });

  it("reviewer: may read patients but not open the staff page", async () => {
    const page = await freshPage();
    await signIn(page, "reviewer@dentate.example");
    expect(new URL(page.url()).pathname).toBe("/patients");
    await page.goto(`${BASE_URL}/staff`);
    expect(new URL(page.url()).pathname).toBe("/no-access");
    await page.close();
  });

  it("research nurse: studies by code and counts; no patient names; patients list refused", async () => {
    const page = await freshPage();
    await signIn(page, "nurse@dentate.example");
    expect(new URL(page.url()).pathname).toBe("/studies");
    await expect.poll(() => page.getByText("HBR-ABL-01").count()).toBe(1);
    await screenshot(page, "studies-nurse");
    await page.goto(`${BASE_URL}/patients`);
    expect(new URL(page.url()).pathname).toBe("/no-access");
    const api = await page.request.get(`${BASE_URL}/api/patients`);
    expect(api.status()).toBe(403);
    await page.close();
  });

  it("admin: patients of both sites and the staff page; sign-out ends the session", async () => {
    const page = await freshPage();
    await signIn(page, "admin@dentate.example");
    await page.goto(`${BASE_URL}/staff`);
    await expect.poll(() => page.getByText("clinician@millbrook.example").count()).toBe(1);
    await screenshot(page, "staff-admin");
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/sign-in$/);
    const res = await page.request.get(`${BASE_URL}/api/patients`);
    expect(res.status()).toBe(401);
    await page.close();
  });

  it("a clinician of another site does not see Harbour Street patients", async () => {
    const page = await freshPage();
    await signIn(page, "clinician@dentate.example");
    const list = await (await page.request.get(`${BASE_URL}/api/patients`)).json();
    const someId = list.rows[0].id;
    await browser.clearCookies();
    await signIn(page, "clinician@millbrook.example");
    const res = await page.request.get(`${BASE_URL}/api/patients/${someId}`);
    expect(res.status()).toBe(404);
    await page.goto(`${BASE_URL}/patients/${someId}`);
    expect(await page.getByText("could not be found", { exact: false }).count()).toBeGreaterThan(0);
    await page.close();
  });
});
