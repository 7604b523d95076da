// ICD-10-CM suggestions from a visit's findings. Suggestions only: the coder or clinician decides.
// A malignancy or in-situ code needs histology; an exam impression alone never produces one.
import type { AinGrade, Cytology, Grade, Histology, HpvResult, P16 } from "@/lib/domain/vocab";
import { icd, type IcdCode, type IcdCodeKey } from "./icd10cm";
import { lastFromAin } from "./last";

export interface CodingLesion {
  grade: Grade;
  histology?: Histology;
  ain?: AinGrade;
  p16?: P16;
  /** Stored frame: positive inside the canal, negative on perianal skin. */
  distanceStartCm: number;
  distanceEndCm?: number;
}

export interface CodingInput {
  lesions: CodingLesion[];
  cytology?: Cytology;
  /** The pathologist called the smear satisfactory but without transformation-zone cells. */
  cytologyLacksTransformationZone?: boolean;
  hpv?: HpvResult;
}

export interface CodeSuggestion extends IcdCode {
  why: string;
}

const CYTOLOGY_CODE: Partial<Record<Cytology, IcdCodeKey>> = {
  asc_us: "R85.610",
  asc_h: "R85.611",
  lsil: "R85.612",
  hsil: "R85.613",
  scc: "R85.614",
  unsatisfactory: "R85.615",
};

const CYTOLOGY_TEXT: Record<Cytology, string> = {
  nilm: "NILM",
  asc_us: "ASC-US",
  asc_h: "ASC-H",
  lsil: "LSIL",
  hsil: "HSIL",
  scc: "squamous cell carcinoma",
  unsatisfactory: "unsatisfactory",
  not_done: "not done",
};

const HPV_CODE: Partial<Record<HpvResult, IcdCodeKey>> = {
  hr_positive_16: "R85.81",
  hr_positive_other: "R85.81",
  lr_positive: "R85.82",
};

function sites(lesion: CodingLesion) {
  const end = lesion.distanceEndCm ?? lesion.distanceStartCm;
  return {
    canal: Math.max(lesion.distanceStartCm, end) >= 0,
    skin: Math.min(lesion.distanceStartCm, end) < 0,
  };
}

function lesionCodes(lesion: CodingLesion): { key: IcdCodeKey; why: string }[] {
  const { canal, skin } = sites(lesion);
  if (!lesion.histology) {
    // Warts are a clinical diagnosis; nothing else is coded from the impression.
    return lesion.grade === "condyloma" ? [{ key: "A63.0", why: "Condyloma seen at examination" }] : [];
  }
  switch (lesion.histology) {
    case "benign":
      return [];
    case "scc":
      // Only the canal has a sourced code here; perianal skin cancer is left to the coder.
      return canal ? [{ key: "C21.1", why: "Histology: squamous cell carcinoma in the anal canal" }] : [];
    case "lsil":
    case "hsil": {
      // ICD-10-CM classes by the AIN grade: K62.82 covers AIN I and II, D01.3 covers AIN III
      // (CMS ICD-10-CM). LSIL is AIN I (or p16-negative AIN II) under LAST, so K62.82 either way;
      // HSIL may be AIN II or AIN III, so without the AIN grade nothing is suggested and
      // codingCautions asks for the grade.
      if (lesion.histology === "hsil" && !lesion.ain) return [];
      const severe = lesion.ain ? lesion.ain === "ain3" : false;
      const label = lesion.ain
        ? `${lesion.ain.toUpperCase()} (${lastFromAin(lesion.ain, lesion.p16).toUpperCase()})`
        : lesion.histology.toUpperCase();
      if (!severe) return [{ key: "K62.82", why: `Histology: ${label}${skin && !canal ? " on perianal skin" : ""}` }];
      const out: { key: IcdCodeKey; why: string }[] = [];
      if (canal) out.push({ key: "D01.3", why: `Histology: ${label} in the anal canal` });
      if (skin) out.push({ key: "D04.5", why: `Histology: ${label} on perianal skin (D01.3 excludes anal margin and perianal skin)` });
      return out;
    }
  }
}

export function suggestCodes(input: CodingInput): CodeSuggestion[] {
  const found = new Map<IcdCodeKey, string[]>();
  const add = (key: IcdCodeKey, why: string) => {
    const reasons = found.get(key) ?? [];
    if (!reasons.includes(why)) reasons.push(why);
    found.set(key, reasons);
  };
  for (const lesion of input.lesions) for (const { key, why } of lesionCodes(lesion)) add(key, why);

  const cytologyKey = input.cytology ? CYTOLOGY_CODE[input.cytology] : undefined;
  if (cytologyKey) add(cytologyKey, `Anal cytology: ${CYTOLOGY_TEXT[input.cytology!]}`);
  if (input.cytologyLacksTransformationZone && input.cytology !== "unsatisfactory") {
    add("R85.616", "Anal cytology satisfactory but without transformation-zone cells");
  }
  const hpvKey = input.hpv ? HPV_CODE[input.hpv] : undefined;
  if (hpvKey) add(hpvKey, hpvKey === "R85.81" ? "Anal high-risk HPV detected" : "Anal low-risk HPV detected");

  return [...found].map(([key, reasons]) => ({ ...icd(key), why: reasons.join("; ") }));
}

/** Findings that need a word to the coder rather than a code. */
export function codingCautions(input: CodingInput): string[] {
  const cautions: string[] = [];
  for (const lesion of input.lesions) {
    if (lesion.grade === "suspected_cancer" && !lesion.histology) {
      cautions.push("Suspected cancer at examination: confirm by histology before any malignancy code (C21.-).");
    }
    if (lesion.histology === "hsil" && !lesion.ain) {
      cautions.push("HSIL on histology without an AIN grade: record AIN II or AIN III to code it (K62.82 covers AIN I–II, D01.3 AIN III).");
    }
    if (lesion.histology === "scc" && sites(lesion).skin) {
      cautions.push("Squamous cell carcinoma on perianal skin: choose the skin-cancer code with the coder.");
    }
  }
  return [...new Set(cautions)];
}
