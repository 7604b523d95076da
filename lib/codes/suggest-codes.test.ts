import { describe, expect, it } from "vitest";
import { codingCautions, suggestCodes, type CodingLesion } from "./suggest-codes";

// Codes and descriptors: CMS ICD-10-CM code file, as listed in CMS ICD-10-CM
// (K62.82 Dysplasia of anus (AIN I and II); D01.3 includes AIN III and excludes anal margin /
// perianal skin, which go to D04.5; A63.0; R85.610-R85.619; R85.81; R85.82).

const canal = (over: Partial<CodingLesion>): CodingLesion => ({ grade: "hsil", distanceStartCm: 2, ...over });
const codes = (s: { code: string }[]) => s.map((x) => x.code);

describe("suggestCodes from histology", () => {
  it("codes histological LSIL as dysplasia of anus", () => {
    const [s] = suggestCodes({ lesions: [canal({ grade: "lsil", histology: "lsil", ain: "ain1" })] });
    expect(s).toMatchObject({ code: "K62.82", descriptor: "Dysplasia of anus" });
  });
  it("codes p16-negative AIN2 as dysplasia of anus", () => {
    expect(codes(suggestCodes({ lesions: [canal({ histology: "lsil", ain: "ain2", p16: "negative" })] }))).toEqual(["K62.82"]);
  });
  it("codes HSIL in the canal as carcinoma in situ of anus and anal canal", () => {
    const [s] = suggestCodes({ lesions: [canal({ histology: "hsil", ain: "ain3" })] });
    expect(s).toMatchObject({ code: "D01.3", descriptor: "Carcinoma in situ of anus and anal canal" });
  });
  it("codes HSIL on perianal skin as D04.5, not D01.3", () => {
    // D01.3 excludes carcinoma in situ of anal margin / perianal skin (D04.5), CMS ICD-10-CM.
    const s = suggestCodes({ lesions: [canal({ histology: "hsil", ain: "ain3", distanceStartCm: -1.5 })] });
    expect(codes(s)).toEqual(["D04.5"]);
    expect(s[0].descriptor).toBe("Carcinoma in situ of skin of trunk"); // CMS code file (descriptor checked against a public copy)
  });
  it("codes both sites for HSIL that crosses the verge", () => {
    expect(codes(suggestCodes({ lesions: [canal({ histology: "hsil", ain: "ain3", distanceStartCm: -1, distanceEndCm: 1 })] }))).toEqual(["D01.3", "D04.5"]);
  });
  it("follows the ICD class of AIN II even when LAST calls it HSIL", () => {
    // K62.82 covers AIN I and II; D01.3 covers AIN III (CMS ICD-10-CM).
    expect(codes(suggestCodes({ lesions: [canal({ histology: "hsil", ain: "ain2", p16: "block_positive" })] }))).toEqual(["K62.82"]);
  });
  it("suggests no code for HSIL without an AIN grade and asks for the grade", () => {
    // One LAST tier, two ICD-10-CM codes: K62.82 = AIN I-II, D01.3 = AIN III (CMS ICD-10-CM), so the
    // grade must be known before either is suggested.
    const input = { lesions: [canal({ histology: "hsil" })] };
    expect(suggestCodes(input)).toEqual([]);
    expect(codingCautions(input).join(" ")).toMatch(/without an AIN grade.*AIN II or AIN III/);
  });
  it("still codes LSIL without an AIN grade as K62.82 (LAST LSIL = AIN I)", () => {
    expect(codes(suggestCodes({ lesions: [canal({ grade: "lsil", histology: "lsil" })] }))).toEqual(["K62.82"]);
  });
  it("lets histology override the impression", () => {
    expect(suggestCodes({ lesions: [canal({ grade: "hsil", histology: "benign" })] })).toEqual([]);
  });
});

describe("suggestCodes from the impression", () => {
  it("codes condyloma as anogenital warts", () => {
    const [s] = suggestCodes({ lesions: [canal({ grade: "condyloma", distanceStartCm: -2 })] });
    expect(s).toMatchObject({ code: "A63.0", descriptor: "Anogenital (venereal) warts" });
  });
  it("never codes an impression of HSIL or cancer", () => {
    expect(suggestCodes({ lesions: [canal({ grade: "hsil" }), canal({ grade: "suspected_cancer" })] })).toEqual([]);
  });
  it("asks for histology before a malignancy code", () => {
    expect(codingCautions({ lesions: [canal({ grade: "suspected_cancer" })] })[0]).toMatch(/confirm by histology/);
  });
});

describe("suggestCodes from cytology and HPV", () => {
  it("maps each Bethesda category to its R85.61x code", () => {
    const expected = { asc_us: "R85.610", asc_h: "R85.611", lsil: "R85.612", hsil: "R85.613", scc: "R85.614", unsatisfactory: "R85.615" } as const;
    for (const [cytology, code] of Object.entries(expected)) {
      expect(codes(suggestCodes({ lesions: [], cytology: cytology as keyof typeof expected }))).toEqual([code]);
    }
    expect(suggestCodes({ lesions: [], cytology: "nilm" })).toEqual([]);
  });
  it("uses the CMS descriptor for ASC-H", () => {
    expect(suggestCodes({ lesions: [], cytology: "asc_h" })[0].descriptor).toBe(
      "Atypical squamous cells cannot exclude high grade squamous intraepithelial lesion on cytologic smear of anus (ASC-H)",
    );
  });
  it("codes high-risk and low-risk HPV separately", () => {
    expect(codes(suggestCodes({ lesions: [], hpv: "hr_positive_16" }))).toEqual(["R85.81"]);
    expect(codes(suggestCodes({ lesions: [], hpv: "lr_positive" }))).toEqual(["R85.82"]);
    expect(suggestCodes({ lesions: [], hpv: "negative" })).toEqual([]);
  });
  it("lists a code once however many lesions lead to it", () => {
    const s = suggestCodes({
      lesions: [canal({ histology: "hsil", ain: "ain3" }), canal({ histology: "hsil", ain: "ain3", distanceStartCm: 3 })],
      cytology: "hsil",
      hpv: "hr_positive_other",
    });
    expect(codes(s)).toEqual(["D01.3", "R85.613", "R85.81"]);
  });
});
