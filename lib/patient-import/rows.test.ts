import { describe, expect, it } from "vitest";
import { readCsv } from "./csv";
import { formulaProblem } from "./cells";
import { guessMapping } from "./fields";
import { checkRows } from "./rows";

const HEAD = "MRN,Family name,Given name,Date of birth,Sex at birth,HIV status,Risk groups,Email";
function check(lines: string[]) {
  const r = readCsv([HEAD, ...lines].join("\n"));
  if (!r.ok) throw new Error(r.message);
  return checkRows(r.table, guessMapping(r.table.headers));
}

describe("formula cells", () => {
  // OWASP, "CSV Injection": cells beginning with = + - @, tab (0x09) or carriage return (0x0D).
  it.each(["=HYPERLINK(\"http://x\",\"y\")", "+1", "-2+3", "@SUM(A1)", "\tx", "\rx", "  =1"])("refuses %j", (v) => {
    expect(formulaProblem(v)).toMatch(/formula/);
  });
  it.each(["O'Brien", "Ng", "1980-03-14", "a=b", "x-y"])("lets %j through", (v) => expect(formulaProblem(v)).toBeNull());
});

describe("checkRows", () => {
  it("gives each bad line its own messages and keeps the good rows with their values", () => {
    const r = check([
      "A1,Ibarra,Noor,1980-03-14,F,pos,msm_tw_hiv;solid_organ_transplant,noor@example.test",
      "A2,Quill,Tam,14/03/1980,M,,,",
      "A3,,Sol,1981-02-30,x,,,",
      'A4,"=HYPERLINK(""http://x"",""y"")",Ren,1979-01-01,M,,,',
      "A5,Veer,Ola,1990-05-05,female,maybe,,not-an-email",
    ]);
    expect(r.rows).toEqual([
      { line: 2, values: { mrn: "A1", familyName: "Ibarra", givenName: "Noor", dateOfBirth: "1980-03-14", sexAtBirth: "female", hivStatus: "positive", riskGroups: ["msm_tw_hiv", "solid_organ_transplant"], contactEmail: "noor@example.test" } },
    ]);
    expect(r.badLines).toEqual([3, 4, 5, 6]);
    const at = (line: number) => r.problems.filter((p) => p.line === line).map((p) => p.message);
    expect(at(3)).toEqual(["Date of birth: Use a date like 1980-03-14 (year-month-day)."]);
    expect(at(4)).toEqual(["Sex at birth: \"x\" is not a sex at birth: use female, male, intersex, unknown.", "Family name: The family name is missing.", "Date of birth: Not a real date."]);
    expect(at(5)).toEqual([expect.stringMatching(/^Family name: Starts with "=", which a spreadsheet would run as a formula/)]);
    expect(at(6)).toEqual(expect.arrayContaining([expect.stringMatching(/^HIV status: "maybe" is not/), "Contact e-mail: Not an e-mail address."]));
  });

  it("refuses every row of an MRN that appears twice, and a 10,000-character cell even in a column not imported", () => {
    const r = check(["B1,Ibarra,Noor,1980-03-14,F,,,", "B2,Quill,Tam,1970-01-01,M,,,", "B1,Ibarra,Nora,1980-03-14,F,,,", `B3,Veer,Ola,1990-05-05,F,,,,${"x".repeat(10_000)}`]);
    expect(r.rows.map((x) => x.line)).toEqual([3]);
    expect(r.problems).toEqual([
      { line: 2, field: "mrn", message: "MRN: B1 appears on lines 2, 4 of this file; keep one line per patient." },
      { line: 4, field: "mrn", message: "MRN: B1 appears on lines 2, 4 of this file; keep one line per patient." },
      { line: 5, field: null, message: "Column 9 (no header) holds 10,000 characters; a cell may hold at most 1,000." },
    ]);
  });
});
