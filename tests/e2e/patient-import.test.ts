// The import page as a clinician uses it: from the patient list, a CSV file with good and bad
// rows shows its first rows with the column each fills and every problem by line; nothing is
// imported until "import the valid rows" is chosen; then the good rows are imported, with
// progress, and the patients are in the list.
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext } from "playwright-core";
import { BASE_URL, launch, screenshot, signIn } from "./browser";

let browser: BrowserContext;
beforeAll(async () => {
  browser = await launch({ width: 1280, height: 1000 });
});
afterAll(async () => {
  await browser?.close();
});

// Invented people; MRNs of this run only.
const tag = randomUUID().slice(0, 6).toUpperCase();
const CSV = [
  "Hospital number,Surname,First name,DOB,Sex,HIV,Risk groups,Postcode,Email,Notes",
  `E${tag}-1,Arkwright,Mina,1979-02-11,F,positive,other_hiv,02139,mina@example.test,`,
  `E${tag}-2,Bellweather,Otto,11/02/1979,M,negative,,,,moved from paper chart`,
  `E${tag}-3,"=HYPERLINK(""http://x"",""y"")",Pia,1985-07-07,F,,,,,`,
  `E${tag}-4,,Quinn,1990-10-10,M,,,,,`,
  `E${tag}-5,Corliss,Rafe,1961-03-30,male,unknown,msm_tw_no_hiv,,rafe@,`,
  `E${tag}-6,Dunleavy,Sade,1970-12-24,female,,,90210,,`,
  `E${tag}-6,Dunleavy,Sade,1970-12-24,female,,,90210,,second copy`,
  `E${tag}-7,Ecclestone,Tove,1958-05-05,F,negative,perianal_warts,,,`,
].join("\n");

describe("patient import page", () => {
  it("previews with errors by line, waits for the explicit choice, then imports the valid rows", async () => {
    const page = await browser.newPage();
    await signIn(page, "clinician@dentate.example");
    await page.goto(`${BASE_URL}/patients`);
    await page.getByRole("link", { name: "Import patients…" }).click();
    await page.waitForURL(`${BASE_URL}/patients/import`);
    await page.getByLabel(/^File/).setInputFiles({ name: "clinic-list.csv", mimeType: "text/csv", buffer: Buffer.from(CSV) });

    const problems = page.getByRole("region", { name: /rows have problems/ });
    await expect.poll(() => problems.isVisible(), { timeout: 15_000 }).toBe(true);
    const text = await problems.textContent();
    expect(text).toContain("Line 3Date of birth: Use a date like 1980-03-14 (year-month-day).");
    expect(text).toMatch(/Line 4Family name: Starts with "=", which a spreadsheet would run as a formula/);
    expect(text).toContain("Line 5Family name: The family name is missing.");
    expect(text).toContain("Line 6Contact e-mail: Not an e-mail address.");
    expect(text).toContain(`Line 7MRN: E${tag}-6 appears on lines 7, 8 of this file`);
    // Header names the page matched itself; the Notes column is not imported.
    expect(await page.getByLabel("Column 1 (Hospital number) imports as").inputValue()).toBe("mrn");
    expect(await page.getByLabel("Column 10 (Notes) imports as").inputValue()).toBe("");
    const importButton = page.getByRole("button", { name: "Import 2 patients" });
    expect(await importButton.isDisabled()).toBe(true);
    await screenshot(page, "patient-import-preview-errors");

    await page.getByLabel(/Import the valid rows/).check();
    await importButton.click();
    await expect.poll(() => page.getByRole("status").filter({ hasText: "Imported:" }).textContent(), { timeout: 15_000 }).toContain("Imported: 2 new, 0 updated, 0 unchanged, 6 left out.");

    await page.goto(`${BASE_URL}/patients?q=E${tag}`);
    expect(await page.locator("main tbody tr").count()).toBe(2);
    expect(await page.locator("main tbody").textContent()).toContain("Arkwright, Mina");
    await page.close();
  });
});
