// ICD-10-CM codes Dentate may suggest. Descriptors are the code file's long descriptions
// (CMS ICD-10-CM code file), checked against a public
// machine-readable copy of the code table. The code year was not verified: re-check each October.

export interface IcdCode {
  code: string;
  descriptor: string;
}

export const ICD10CM = {
  "K62.82": "Dysplasia of anus",
  "D01.3": "Carcinoma in situ of anus and anal canal",
  // Inclusion terms of D04.5 name carcinoma in situ of anal margin, anal skin and perianal skin
  // (secondary code-lookup pages; D01.3 excludes these and points here: CMS ICD-10-CM).
  "D04.5": "Carcinoma in situ of skin of trunk",
  "A63.0": "Anogenital (venereal) warts",
  "C21.1": "Malignant neoplasm of anal canal",
  "R85.610": "Atypical squamous cells of undetermined significance on cytologic smear of anus (ASC-US)",
  "R85.611": "Atypical squamous cells cannot exclude high grade squamous intraepithelial lesion on cytologic smear of anus (ASC-H)",
  "R85.612": "Low grade squamous intraepithelial lesion on cytologic smear of anus (LGSIL)",
  "R85.613": "High grade squamous intraepithelial lesion on cytologic smear of anus (HGSIL)",
  "R85.614": "Cytologic evidence of malignancy on smear of anus",
  "R85.615": "Unsatisfactory cytologic smear of anus",
  "R85.616": "Satisfactory anal smear but lacking transformation zone",
  "R85.618": "Other abnormal cytological findings on specimens from anus",
  "R85.619": "Unspecified abnormal cytological findings in specimens from anus",
  "R85.81": "Anal high risk human papillomavirus (HPV) DNA test positive",
  "R85.82": "Anal low risk human papillomavirus (HPV) DNA test positive",
} as const;

export type IcdCodeKey = keyof typeof ICD10CM;

export function icd(code: IcdCodeKey): IcdCode {
  return { code, descriptor: ICD10CM[code] };
}
