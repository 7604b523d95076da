// What each column of the outcomes export means, shipped with the workbook as its own sheet, so a
// statistician never has to guess which definition of recurrence a column uses.
// tests/integration/effective-grade-sql.test.ts checks that every exported column is worded here.

export const OUTCOME_COLUMNS: Record<string, string> = {
  study_id: "Study subject ID given at enrolment.",
  birth_year: "Year of birth; empty when the patient is over 89 at enrolment or at export (45 CFR 164.514(b)(2)(i)(C)).",
  age_at_enrolment: "Completed years at enrolment; every age over 89 is '90+'.",
  sex_at_birth: "Sex at birth as recorded.",
  hiv_status: "HIV status as recorded.",
  risk_groups: "Screening risk groups, separated by ';'.",
  zip3: "First three digits of the ZIP code; '000' for restricted areas (HHS Safe Harbor guidance).",
  enrolment_year: "Year of enrolment (year mode only).",
  visits: "Signed visits exported (before any withdrawal).",
  first_hsil_day: "First visit with HSIL or worse. A lesion counts by its effective grade: histology, when there is one, overrides the exam impression.",
  first_hsil_year: "As first_hsil_day, as a year.",
  treatments: "Treatments recorded at exported visits.",
  first_treatment_day: "First visit with a treatment.",
  first_treatment_year: "As first_treatment_day, as a year.",
  days_treatment_to_clearance: "Days from the first treatment to the first later visit without HSIL or worse (effective grade); empty if never clear.",
  days_clearance_to_recurrence_or_censor: "Days from that clear visit to HSIL or worse again, or to the last exported visit when none.",
  recurrence:
    "Recurrence after a clear visit: 1 when HSIL or worse is seen at any visit after the first clear visit following treatment (at the treated site or elsewhere), 0 when not, empty when never clear.",
  hsil_after_treatment:
    "Overall recurrence after treatment, persistent + metachronous (Liu, Sigel & Gaisa, Papillomavirus Research 2018;5:S9): 1 when HSIL or worse is seen at any visit after the first treatment, whether or not a clear visit came between; empty when never treated.",
  progressed_to_cancer: "1 when a lesion's effective grade reaches the top tier: squamous cell carcinoma on histology, or suspected cancer at the exam with no histology yet.",
  cancer_day: "First visit at which progressed_to_cancer became 1.",
  cancer_year: "As cancer_day, as a year.",
};

export const TRACK_STATUS_NOTE =
  "Track statuses (lesions.track_status, counts.tracks_*): new; persistent = disease at the same site at the next look at the same grade tier (condyloma and LSIL are one tier), or at a lower tier at the first look after treatment (treatment response, not regression); progressed = a higher tier; regressed = a lower tier or gone at an untreated site; cleared = not found or benign after treatment; recurrent = found again after a clear visit that followed treatment.";

/** Rows for the workbook's dictionary sheet. */
export function dictionaryRows(): { dataset: string; column: string; meaning: string }[] {
  return [
    ...Object.entries(OUTCOME_COLUMNS).map(([column, meaning]) => ({ dataset: "outcomes", column, meaning })),
    { dataset: "lesions / counts", column: "track_status, tracks_*", meaning: TRACK_STATUS_NOTE },
  ];
}
