// A clinician records a complete visit (map, two biopsies, one ablation with local
// anaesthetic, one photograph), signs it, downloads the PDF, and the PDF's text holds the
// findings (read back with pdf-parse, a general PDF text extractor).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import sharp from "sharp";
import { PDFParse } from "pdf-parse";
import type { BrowserContext, Page } from "playwright-core";
import { answerSigningPrompt, BASE_URL, launch, screenshot, signIn } from "./browser";

let browser: BrowserContext;
let page: Page;
const headers = { origin: BASE_URL };

beforeAll(async () => {
  browser = await launch({ width: 1280, height: 900 });
  page = await browser.newPage();
  await signIn(page, "clinician@dentate.example");
});
afterAll(async () => {
  await browser?.close();
});

describe("a complete visit, signed and reported", () => {
  it("records map, biopsies, ablation with anaesthetic and a photograph; signs; the PDF holds the findings", async () => {
    const list = await (await page.request.get(`${BASE_URL}/api/patients?page=2`)).json();
    const patientId: string = list.rows[3].id;
    // A visit dated after every demo visit, opened from the patient page like a clinician would.
    await page.goto(`${BASE_URL}/patients/${patientId}`);
    // Today: dates of care may not lie more than a day ahead, and the demo's visits all lie before today.
    await page.getByLabel("Visit date").fill(new Date().toISOString().slice(0, 10));
    await page.getByRole("button", { name: "Start visit" }).click();
    await page.waitForURL(/\/visits\/[0-9a-f-]{36}$/);
    const visitId = page.url().split("/").pop()!;

    // Two mapped lesions (the map gestures have their own end-to-end test).
    const mk = async (body: object) => (await (await page.request.post(`${BASE_URL}/api/visits/${visitId}/lesions`, { data: body, headers })).json()).lesion;
    const hsil = await mk({ clockStartH: 1, clockEndH: 3, distanceStartCm: 1, distanceEndCm: 2, grade: "hsil", morphology: "flat", acetowhite: "dense", lugol: "negative", vessels: ["punctation"] });
    const wart = await mk({ clockStartH: 7, clockEndH: 8, distanceStartCm: -2, distanceEndCm: -1, grade: "condyloma", morphology: "papillary" });
    await page.reload();

    // Two biopsies through the panel: specimen letters A then B.
    await page.getByRole("tab", { name: "Biopsies" }).click();
    const panel = page.getByRole("region", { name: "Biopsies" });
    for (const [lesion, letter] of [[hsil, "A"], [wart, "B"]] as const) {
      await panel.getByLabel("From lesion").selectOption(lesion.id);
      await panel.getByRole("button", { name: "Take biopsy", exact: true }).click();
      await expect.poll(() => panel.getByText(`Specimen ${letter}`, { exact: true }).count()).toBe(1);
    }

    // One ablation under 1% lidocaine, 5 mL = 50 mg (1% = 10 mg/mL: concentration arithmetic, domain facts §6).
    expect((await page.request.post(`${BASE_URL}/api/visits/${visitId}/anaesthetic`, { data: { agent: "lidocaine", concentrationPct: 1, volumeMl: 5, withEpinephrine: false }, headers })).status()).toBe(201);
    expect((await page.request.post(`${BASE_URL}/api/visits/${visitId}/treatments`, { data: { lesionId: hsil.id, modality: "electrocautery", arcs: [{ startH: 1, endH: 3 }] }, headers })).status()).toBe(201);

    // One photograph through the upload control.
    const jpeg = await sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 180, g: 120, b: 120 } } }).jpeg().toBuffer();
    await page.reload();
    await page.locator('input[type="file"]').setInputFiles({ name: "anoscopy.jpg", mimeType: "image/jpeg", buffer: jpeg });
    await page.getByRole("button", { name: "Upload", exact: true }).click();
    await expect.poll(async () => (await (await page.request.get(`${BASE_URL}/api/visits/${visitId}/attachments`)).json()).attachments?.length ?? 0, { timeout: 15_000 }).toBe(1);

    // Sign.
    await page.reload();
    await page.getByRole("tab", { name: "Record & sign" }).click();
    await page.getByRole("button", { name: "Sign visit…" }).click();
    // The demo patient's earlier tracks each need a decision before the visit can be signed.
    await answerSigningPrompt(page, "Not examined");
    await page.getByRole("button", { name: "Yes, sign this visit" }).click();
    await expect.poll(() => page.getByText(/Signed by/).count(), { timeout: 15_000 }).toBeGreaterThan(0);
    await screenshot(page, "complete-visit-signed");
    const locked = await page.request.post(`${BASE_URL}/api/visits/${visitId}/lesions`, { data: { clockStartH: 4, clockEndH: 5, distanceStartCm: 1, distanceEndCm: 2, grade: "lsil" }, headers });
    expect(locked.status()).toBe(423);

    // The PDF.
    const pdf = await page.request.get(`${BASE_URL}/api/visits/${visitId}/report`);
    expect(pdf.status()).toBe(200);
    expect(pdf.headers()["content-type"]).toContain("application/pdf");
    const parser = new PDFParse({ data: new Uint8Array(await pdf.body()) });
    const text = (await parser.getText()).text;
    await parser.destroy();
    expect(text).toContain("HSIL");
    expect(text).toContain("Condyloma");
    expect(text).toMatch(/Electrocautery/i);
    expect(text).toMatch(/50 mg/);
    expect(text).toMatch(/\bA\b[\s\S]*\bB\b/);
    expect(text).not.toMatch(/DRAFT/);
  });
});
