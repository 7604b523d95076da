// The controlled vocabulary shared by the schema, the validation schemas and the UI.
// Trade terms (LAST/Bethesda grades, anatomical words) are kept as the trade uses them;
// everything else is our own plain wording. Pure: no I/O.

export const ROLES = ["clinician", "reviewer", "research_nurse", "admin"] as const;
export type Role = (typeof ROLES)[number];

/** How the patient lay during the exam; decides how clock numbers are read. */
export const POSITIONS = ["lithotomy", "prone_jackknife", "left_lateral"] as const;
export type Position = (typeof POSITIONS)[number];

/** Impression grade at the exam (LAST two-tier terms plus condyloma and suspected cancer). */
export const GRADES = ["benign", "condyloma", "lsil", "hsil", "suspected_cancer"] as const;
export type Grade = (typeof GRADES)[number];

/** Histology in LAST terms (Darragh TM et al., Arch Pathol Lab Med 2012;136:1266-97). */
export const HISTOLOGY = ["benign", "lsil", "hsil", "scc"] as const;
export type Histology = (typeof HISTOLOGY)[number];

export const AIN_GRADES = ["ain1", "ain2", "ain3"] as const;
export type AinGrade = (typeof AIN_GRADES)[number];

export const P16 = ["block_positive", "not_block", "negative", "not_done"] as const;
export type P16 = (typeof P16)[number];

/** Bethesda categories for anal cytology (Darragh & Winkler, Sexual Health 2012) plus unsatisfactory. */
export const CYTOLOGY = ["nilm", "asc_us", "asc_h", "lsil", "hsil", "scc", "unsatisfactory", "not_done"] as const;
export type Cytology = (typeof CYTOLOGY)[number];

export const HPV_RESULTS = ["not_done", "negative", "hr_positive_16", "hr_positive_other", "lr_positive"] as const;
export type HpvResult = (typeof HPV_RESULTS)[number];

/** Squamocolumnar junction seen fully / partially / not at all. */
export const ADEQUACY = ["scj_full", "scj_partial", "scj_not_seen"] as const;
export type Adequacy = (typeof ADEQUACY)[number];

/** Surface contour (Jay N et al., Dis Colon Rectum 1997). */
export const MORPHOLOGY = ["flat", "raised", "papillary", "ulcerated"] as const;
export type Morphology = (typeof MORPHOLOGY)[number];

export const ACETOWHITE = ["none", "faint", "dense"] as const;
export type Acetowhite = (typeof ACETOWHITE)[number];

/** Lugol's iodine uptake: negative (unstained, yellow), partial, positive (brown). */
export const LUGOL = ["not_applied", "negative", "partial", "positive"] as const;
export type Lugol = (typeof LUGOL)[number];

export const VESSELS = ["punctation", "mosaic", "atypical"] as const;
export type Vessel = (typeof VESSELS)[number];

/** Zones by distance from the verge; perianal skin lies outside the verge. */
export const ZONES = ["perianal", "distal_canal", "transformation_zone", "proximal_canal", "distal_rectum"] as const;
export type Zone = (typeof ZONES)[number];

export const MODALITIES = [
  "electrocautery",
  "infrared_coagulation",
  "laser",
  "surgical_excision",
  "topical_imiquimod",
  "topical_fluorouracil",
  "topical_cidofovir",
  "other",
] as const;
export type Modality = (typeof MODALITIES)[number];

export const ANAESTHETIC_AGENTS = ["lidocaine", "bupivacaine"] as const;
export type AnaestheticAgent = (typeof ANAESTHETIC_AGENTS)[number];

export const TRACK_STATUSES = ["new", "persistent", "regressed", "progressed", "cleared", "recurrent"] as const;
export type TrackStatus = (typeof TRACK_STATUSES)[number];

/** A reviewer's verdict on one track's status; not_examined when the record does not let them judge it. */
export const VERDICTS = ["agree", "disagree", "not_examined"] as const;
export type Verdict = (typeof VERDICTS)[number];

/** How a reviewer's disagreement was settled: which view of the track's status stands. */
export const DISAGREEMENT_OUTCOMES = ["proposed_accepted", "recorded_kept"] as const;
export type DisagreementOutcome = (typeof DISAGREEMENT_OUTCOMES)[number];
export const DISAGREEMENT_OUTCOME_LABEL: Record<DisagreementOutcome, string> = {
  proposed_accepted: "The reviewer's status stands: I have changed the record to match",
  recorded_kept: "The recorded status stands",
};

/**
 * What the examiner decided at a follow-up visit for an earlier track without a lesion drawn there:
 * looked for and not found, treated, or not examined (the site could not be or was not looked at;
 * it never counts as clear).
 */
export const TRACK_CHECK_OUTCOMES = ["not_found", "treated", "not_examined"] as const;
export type TrackCheckOutcome = (typeof TRACK_CHECK_OUTCOMES)[number];

export const SEX_AT_BIRTH = ["female", "male", "intersex", "unknown"] as const;
export const HIV_STATUS = ["positive", "negative", "unknown"] as const;
/** Risk groups as the IANS 2024 screening consensus distinguishes them (Stier EA et al., Int J Cancer 2024). */
export const RISK_GROUPS = [
  "msm_tw_hiv", // men who have sex with men and transgender women, living with HIV
  "other_hiv", // other people living with HIV
  "msm_tw_no_hiv", // MSM and transgender women without HIV
  "solid_organ_transplant",
  "vulvar_hsil_or_cancer",
  "cervical_vaginal_hsil_or_cancer",
  "perianal_warts",
  "persistent_cervical_hpv16",
  "other",
] as const;
export type RiskGroup = (typeof RISK_GROUPS)[number];

/** Whether a patient is followed: inactive and deceased patients keep their record but leave the worklist. */
export const PATIENT_STATUSES = ["active", "inactive", "deceased"] as const;
export type PatientStatus = (typeof PATIENT_STATUSES)[number];

export const COMPLICATION_KINDS = ["pain", "bleeding", "other"] as const;
export const SEVERITIES = ["mild", "moderate", "severe"] as const;

export const VISIT_STATUSES = ["draft", "signed"] as const;
export type VisitStatus = (typeof VISIT_STATUSES)[number];

/**
 * Order of grades for showing the worst finding (higher is worse): LSIL is named before condyloma
 * because it says more. Common practice, no source. Progression and regression use GRADE_TIER.
 */
export const GRADE_RANK: Record<Grade, number> = {
  benign: 0,
  condyloma: 1,
  lsil: 2,
  hsil: 3,
  suspected_cancer: 4,
};

/**
 * Tier of a grade for progression, regression and follow-up intervals. Condyloma is a low-grade
 * squamous intraepithelial lesion under LAST (Darragh TM et al., Arch Pathol Lab Med
 * 2012;136:1266-97), so condyloma and LSIL are one tier: a change between them is neither
 * progression nor regression.
 */
export const GRADE_TIER: Record<Grade, number> = {
  benign: 0,
  condyloma: 1,
  lsil: 1,
  hsil: 2,
  suspected_cancer: 3,
};

export const ROLE_LABEL: Record<Role, string> = {
  clinician: "Clinician",
  reviewer: "Reviewer",
  research_nurse: "Research nurse",
  admin: "Administrator",
};

export const GRADE_LABEL: Record<Grade, string> = {
  benign: "Benign / normal",
  condyloma: "Condyloma",
  lsil: "LSIL",
  hsil: "HSIL",
  suspected_cancer: "Suspected cancer",
};

export const HISTOLOGY_LABEL: Record<Histology, string> = {
  benign: "Benign",
  lsil: "LSIL",
  hsil: "HSIL",
  scc: "Squamous cell carcinoma",
};

/** Histology mapped onto the impression scale so that histology can decide the grade for tracking. */
export const HISTOLOGY_AS_GRADE: Record<Histology, Grade> = {
  benign: "benign",
  lsil: "lsil",
  hsil: "hsil",
  scc: "suspected_cancer",
};
