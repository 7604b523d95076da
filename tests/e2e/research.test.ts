// The research nurse downloads the per-visit counts CSV and the workbook of the demo study in
// Chromium; both files are parsed with their libraries' readers (csv-parse, exceljs) and checked
// against counts taken straight from the database with an independent query.
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { BrowserContext, Page } from "playwright-core";
import { parse } from "csv-parse/sync";
import ExcelJS from "exceljs";
import postgres from "postgres";
import { BASE_URL, launch, screenshot, signIn } from "./browser";

let browser: BrowserContext;
let sql: postgres.Sql;
beforeAll(async () => {
  browser = await launch({ width: 1360, height: 1000 });
  sql = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
});
afterAll(async () => {
  await browser?.close();
  await sql?.end();
});

/** Lesions per signed visit before any withdrawal, keyed "studyId#sequence" (sequence among signed visits). */
async function expectedCounts(): Promise<Map<string, number>> {
  const rows = await sql<{ study_id: string; seq: number; n: number }[]>`
    SELECT e.study_subject_id AS study_id,
      row_number() OVER (PARTITION BY v.patient_id ORDER BY v.visit_date, v.created_at)::int AS seq,
      (SELECT count(*)::int FROM lesions l WHERE l.visit_id = v.id) AS n,
      v.visit_date, e.withdrawn_on
    FROM enrolments e JOIN studies s ON s.id = e.study_id AND s.code = 'HBR-ABL-01'
    JOIN visits v ON v.patient_id = e.patient_id AND v.status = 'signed'
    WHERE e.withdrawn_on IS NULL OR v.visit_date < e.withdrawn_on`;
  return new Map(rows.map((r) => [`${r.study_id}#${r.seq}`, r.n]));
}

async function download(page: Page, linkName: RegExp): Promise<Buffer> {
  const [file] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name: linkName }).click()]);
  return readFileSync((await file.path())!);
}

describe("research nurse exports", () => {
  it("picks the study, downloads counts CSV and workbook, and both match the database", async () => {
    const page = await browser.newPage();
    await signIn(page, "nurse@dentate.example");
    await page.goto(`${BASE_URL}/studies`);
    await page.getByRole("link", { name: "HBR-ABL-01" }).click();
    await page.waitForURL(/\/studies\/[0-9a-f-]{36}$/);
    await page.getByRole("heading", { name: /Lesions by grade over time/ }).waitFor();

    // No MRN or family name of any demo patient is on the nurse's screen.
    const body = await page.locator("body").innerText();
    const people = await sql<{ mrn: string; family_name: string }[]>`SELECT mrn, family_name FROM patients p JOIN sites s ON s.id = p.site_id AND s.code = 'HBR'`;
    for (const p of people) {
      expect(body).not.toContain(p.mrn);
      expect(body).not.toContain(p.family_name);
    }
    await screenshot(page, "study-dashboard-nurse");

    const expected = await expectedCounts();
    const csv = parse(await download(page, /Lesion counts per visit/), { columns: true }) as Record<string, string>[];
    expect(csv.length).toBe(expected.size);
    for (const r of csv) expect(Number(r.lesions), `${r.study_id}#${r.visit_seq}`).toBe(expected.get(`${r.study_id}#${r.visit_seq}`));

    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load((await download(page, /All three \(workbook\)/)) as unknown as ArrayBuffer);
    const sheet = wb.getWorksheet("Counts per visit")!;
    const header = (sheet.getRow(1).values as unknown[]).slice(1);
    const col = (name: string) => header.indexOf(name) + 1;
    const fromSheet = new Map<string, number>();
    sheet.eachRow((row, i) => {
      if (i > 1) fromSheet.set(`${row.getCell(col("study_id")).value}#${row.getCell(col("visit_seq")).value}`, Number(row.getCell(col("lesions")).value));
    });
    expect(fromSheet).toEqual(expected);
    await page.close();
  });

  it("shows the clinic quality panel to an admin", async () => {
    await browser.clearCookies();
    const page = await browser.newPage();
    await signIn(page, "admin@dentate.example");
    await page.goto(`${BASE_URL}/quality?year=2024`);
    await page.getByRole("heading", { name: "HBR" }).waitFor();
    await screenshot(page, "quality-admin");
    await page.close();
  });
});
