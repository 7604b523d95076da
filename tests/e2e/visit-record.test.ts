import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { answerSigningPrompt, BASE_URL, launch, screenshot, signIn } from "./browser";

// A clinician documents the procedure around the map on a fresh visit of a demo patient:
// exam details, two injections (the second over the lidocaine maximum, saved with a reason),
// treated arcs reaching half the circumference (saved with a reason), a complication, then signs.

let browser: BrowserContext;
let page: Page;
let visitPath = "";

beforeAll(async () => {
  browser = await launch({ width: 1280, height: 1000 });
  page = await browser.newPage();
  await signIn(page, "clinician@dentate.example");
  const { rows } = await (await page.request.get(`${BASE_URL}/api/patients`)).json();
  const patientId = rows[0].id as string;
  const created = await page.request.post(`${BASE_URL}/api/patients/${patientId}/visits`, {
    headers: { origin: BASE_URL },
    data: { visitDate: "2026-05-04", patientPosition: "lithotomy", indication: "Surveillance after HSIL" },
  });
  expect(created.status()).toBe(201);
  visitPath = `/patients/${patientId}/visits/${(await created.json()).visit.id}`;
});
afterAll(async () => {
  await browser?.close();
});

describe("the visit record panels", () => {
  it("records exam details, doses with the maximum shown, and an over-limit injection with a reason", async () => {
    await page.goto(`${BASE_URL}${visitPath}`);
    // The record sections sit in tabs beside the map: exam details under "Record & sign".
    await page.getByRole("tab", { name: "Record & sign" }).click();
    await page.getByRole("tabpanel").getByTestId("visit-record-panels").waitFor();
    await expect.poll(() => page.getByText("only the label ceiling applies").count()).toBeGreaterThan(0);
    await page.getByLabel("Patient weight (kg)").fill("70");
    await page.getByLabel("Prior anal cytology (Bethesda)").selectOption("hsil");
    await page.getByRole("button", { name: "Save exam details" }).click();
    await page.getByText("✓ Saved").waitFor();
    await page.getByRole("tab", { name: "Procedure" }).click();

    await page.getByLabel("Volume (mL)").fill("20");
    await page.getByRole("button", { name: "Add injection" }).click();
    // Lidocaine label: 4.5 mg/kg × 70 kg = 315 mg, capped at 300 mg (product labels); 1 % × 20 mL = 200 mg.
    await page.getByText("200 mg", { exact: true }).first().waitFor();
    await expect.poll(() => page.getByText("of 300 mg").count()).toBeGreaterThan(0);
    await page.getByLabel("Volume (mL)").fill("12");
    // 200 + 120 = 320 mg > 300 mg: the form shows the caution and asks for a reason before saving.
    await page.getByText("This brings lidocaine to 320 mg, over the maximum of 300 mg", { exact: false }).waitFor();
    await page.getByLabel("Reason for going over the maximum").fill("Long session; discussed with the anaesthetist");
    await page.getByRole("button", { name: "Add injection" }).click();
    await page.getByText(/recorded reason: Long session/).waitFor();
  });

  it("asks for a reason once the treated arcs reach half the circumference", async () => {
    // Pineda CE et al., J Gastrointest Surg 2007: staged treatment for circumferential disease; 50 % level from memory.
    await page.getByLabel("Arc 1 from (clock hour)").fill("11");
    await page.getByLabel("Arc 1 to (clock hour)").fill("2");
    await page.getByRole("button", { name: "Add treatment" }).click();
    // Saved when the form has been cleared and the list shows the stored arc.
    await expect.poll(() => page.getByLabel("Arc 1 from (clock hour)").inputValue()).toBe("");
    await page.getByText("Treated 25% of the circumference (3 of 12 clock hours).", { exact: true }).waitFor();
    await page.getByLabel("Arc 1 from (clock hour)").fill("2");
    await page.getByLabel("Arc 1 to (clock hour)").fill("5");
    await page.getByLabel("Reason for treating this much in one session").fill("Patient travels far; agreed single session");
    await page.getByRole("button", { name: "Add treatment" }).click();
    await page.getByText("Large part of the circumference treated at this visit").waitFor();

    await page.getByLabel("What").selectOption("bleeding");
    await page.getByRole("button", { name: "Add complication" }).click();
    await page.getByText(/recorded reason: Patient travels far/).waitFor();
    await page.getByText(/mild, during the procedure/).waitFor();
    await screenshot(page, "visit-record-draft");
    // The whole circumference in one tick: the form names it and asks for the reason (100 % ≥ 50 %).
    await page.getByLabel("Whole circumference treated").check();
    await page.getByText("The whole circumference (12 of 12 clock hours)").first().waitFor();
    await page.getByLabel("Reason for treating this much in one session").first().waitFor();
    await screenshot(page, "visit-record-whole-circumference");
    await page.getByLabel("Whole circumference treated").uncheck();
  });

  it("signs the visit, turns the record read-only and takes an addendum", async () => {
    await page.getByRole("tab", { name: "Record & sign" }).click();
    await page.getByRole("button", { name: "Sign visit…" }).click();
    // The demo patient's earlier tracks each need a decision before the visit can be signed.
    await answerSigningPrompt(page, "Not found");
    await page.getByRole("button", { name: "Yes, sign this visit" }).click();
    await page.getByText("Signed record: read-only").waitFor();
    await page.getByRole("tab", { name: "Procedure" }).click();
    expect(await page.getByRole("button", { name: "Add injection" }).count()).toBe(0);
    await page.getByRole("tab", { name: "Record & sign" }).click();
    await page.getByLabel("New addendum").fill("Histology requested by phone.");
    await page.getByRole("button", { name: "Add addendum" }).click();
    await page.getByText(/Addendum 1 · Dr /).waitFor();
    await expect.poll(() => page.getByText("Histology requested by phone.").count()).toBeGreaterThan(0);
    await screenshot(page, "visit-record-signed");
  });
});
