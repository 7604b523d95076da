import { describe, expect, it } from "vitest";
import { readCsv } from "./csv";
import { assignColumn, guessMapping, mappingProblems } from "./fields";
import { MAX_ROWS } from "./limits";

describe("readCsv", () => {
  it("numbers records by the file line they start on, a quoted cell spanning lines included (RFC 4180 §2.6)", () => {
    const r = readCsv('MRN,Family name\r\n1,"Two\r\nlines"\r\n\r\n3,Three\r\n');
    if (!r.ok) throw new Error(r.message);
    expect(r.table.headers).toEqual(["MRN", "Family name"]);
    expect(r.table.records).toEqual([
      { line: 2, cells: ["1", "Two\nlines"] },
      { line: 5, cells: ["3", "Three"] },
    ]);
  });

  it("reads semicolon-separated files as spreadsheets in many locales save them, and drops a byte-order mark", () => {
    const r = readCsv("\uFEFFMRN;Surname\n7;Ibarra\n");
    expect(r.ok && r.table).toEqual({ headers: ["MRN", "Surname"], records: [{ line: 2, cells: ["7", "Ibarra"] }] });
  });

  it("refuses an empty file, a header alone, an unclosed quote, NUL bytes and too many rows, saying which", () => {
    expect(readCsv("")).toEqual({ ok: false, message: "The file is empty." });
    expect(readCsv("MRN,Surname\n")).toMatchObject({ ok: false, message: expect.stringContaining("no patients") });
    expect(readCsv('MRN,Surname\n1,"open\n')).toMatchObject({ ok: false, message: expect.stringContaining("cannot be read as CSV") });
    expect(readCsv("MRN\n\u0000\n")).toMatchObject({ ok: false, message: expect.stringContaining("not a text file") });
    const atLimit = "MRN\n" + Array.from({ length: MAX_ROWS }, (_, i) => String(i)).join("\n");
    expect(readCsv(atLimit).ok).toBe(true);
    expect(readCsv(atLimit + "\nx")).toMatchObject({ ok: false, message: expect.stringContaining("more than 10,000") });
  });
});

describe("column mapping", () => {
  it("matches usual header names whatever their case and punctuation, each column once", () => {
    const m = guessMapping(["Surname", "FIRST NAME", "D.O.B.", "MRN", "Sex", "E-mail", "Notes"]);
    expect(m).toEqual({ mrn: 3, familyName: 0, givenName: 1, dateOfBirth: 2, sexAtBirth: 4, postalCode: null, hivStatus: null, riskGroups: null, contactEmail: 5 });
  });

  it("names a required field without a column and a column chosen twice", () => {
    const m = { ...guessMapping(["MRN", "Surname", "Given", "DOB", "Sex"]), givenName: 1 };
    expect(mappingProblems(m, 5)).toEqual(["Column 2 is chosen for both family name and given names."]);
    expect(mappingProblems({ ...m, givenName: 2, mrn: null }, 5)).toEqual(["Choose the column that holds MRN."]);
  });

  it("moves a column to the field chosen for it, freeing the field that had it and the field's old column", () => {
    const m = guessMapping(["MRN", "Surname", "Given", "DOB", "Sex", "Email"]);
    expect(assignColumn(m, 1, "givenName")).toMatchObject({ familyName: null, givenName: 1 });
    expect(assignColumn(m, 5, null)).toMatchObject({ contactEmail: null, mrn: 0 });
  });
});
