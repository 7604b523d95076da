import {
  boolean, char, date, doublePrecision, index, integer, jsonb, pgTable, text, timestamp, unique, uniqueIndex, uuid,
} from "drizzle-orm/pg-core";
import { sql } from "drizzle-orm";
import { sites, users } from "./accounts";
import * as e from "./enums";

export const patients = pgTable(
  "patients",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    mrn: text("mrn").notNull(),
    familyName: text("family_name").notNull(),
    givenName: text("given_name").notNull(),
    dateOfBirth: date("date_of_birth").notNull(),
    sexAtBirth: e.sexEnum("sex_at_birth").notNull(),
    genderIdentity: text("gender_identity"),
    hivStatus: e.hivEnum("hiv_status").notNull().default("unknown"),
    /** IANS 2024 risk groups: a set, since they overlap (HIV and a transplant, say). Empty when none applies. */
    riskGroups: e.riskGroupEnum("risk_groups").array().notNull().default(sql`'{}'::risk_group[]`),
    /** Date of transplant or of vulvar HSIL diagnosis, where a risk group needs one. */
    riskDate: date("risk_date"),
    zip: text("zip"),
    contactEmail: text("contact_email"),
    consentEmail: boolean("consent_email").notNull().default(false),
    consentResearch: boolean("consent_research").notNull().default(false),
    /** The clinician responsible for follow-up. */
    clinicianId: text("clinician_id").references(() => users.id),
    /** Active patients are on the worklist; inactive and deceased ones keep their record but leave it. */
    status: e.patientStatusEnum("status").notNull().default("active"),
    /** Optimistic-concurrency version of the demographics. */
    version: integer("version").notNull().default(1),
    nextDueOverride: date("next_due_override"),
    nextDueOverrideReason: text("next_due_override_reason"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    unique("patients_site_mrn").on(t.siteId, t.mrn),
    index("patients_site_name_idx").on(t.siteId, t.familyName, t.givenName),
    // The duplicate check looks for the same date of birth at a site, then compares names.
    index("patients_site_dob_idx").on(t.siteId, t.dateOfBirth),
  ],
);

export const visits = pgTable(
  "visits",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id").notNull().references(() => patients.id),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    visitDate: date("visit_date").notNull(),
    examinerId: text("examiner_id").notNull().references(() => users.id),
    patientPosition: e.positionEnum("patient_position").notNull().default("lithotomy"),
    indication: text("indication"),
    cytology: e.cytologyEnum("cytology").notNull().default("not_done"),
    hpvResult: e.hpvEnum("hpv_result").notNull().default("not_done"),
    adequacy: e.adequacyEnum("adequacy"),
    examStartedAt: timestamp("exam_started_at", { withTimezone: true }),
    examEndedAt: timestamp("exam_ended_at", { withTimezone: true }),
    anaesthesia: text("anaesthesia"),
    patientWeightKg: doublePrecision("patient_weight_kg"),
    plan: text("plan"),
    status: e.visitStatusEnum("status").notNull().default("draft"),
    signedAt: timestamp("signed_at", { withTimezone: true }),
    signedBy: text("signed_by").references(() => users.id),
    /** Optimistic-concurrency version of the visit header. */
    version: integer("version").notNull().default(1),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("visits_patient_date_idx").on(t.patientId, t.visitDate), index("visits_site_date_idx").on(t.siteId, t.visitDate)],
);

export const complications = pgTable("complications", {
  id: uuid("id").primaryKey().defaultRandom(),
  visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
  siteId: uuid("site_id").notNull().references(() => sites.id),
  kind: e.complicationEnum("kind").notNull(),
  severity: e.severityEnum("severity").notNull(),
  afterProcedure: boolean("after_procedure").notNull().default(false),
  note: text("note"),
});

/** One lesion's identity across visits. */
export const lesionTracks = pgTable(
  "lesion_tracks",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id").notNull().references(() => patients.id),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    /** Short label shown on maps ("#1", "#2"…; lib/domain/track-label.ts), unique per patient. */
    label: text("label").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("tracks_patient_label").on(t.patientId, t.label)],
);

/**
 * A lesion seen at a visit, in the stored anatomical frame: clock hours in the lithotomy
 * convention, decimal [0, 12) with 12 o'clock stored as 0, clockwise from clockStartH to
 * clockEndH; distance from the anal verge in cm, positive inside the canal, negative on the
 * perianal skin outside the verge.
 */
export const lesions = pgTable(
  "lesions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    trackId: uuid("track_id").references(() => lesionTracks.id),
    label: text("label").notNull(),
    clockStartH: doublePrecision("clock_start_h").notNull(),
    clockEndH: doublePrecision("clock_end_h").notNull(),
    distanceStartCm: doublePrecision("distance_start_cm").notNull(),
    distanceEndCm: doublePrecision("distance_end_cm").notNull(),
    zone: e.zoneEnum("zone").notNull(),
    grade: e.gradeEnum("grade").notNull(),
    morphology: e.morphologyEnum("morphology"),
    acetowhite: e.acetowhiteEnum("acetowhite"),
    lugol: e.lugolEnum("lugol"),
    vessels: text("vessels").array().notNull().default([]),
    sizeMm: doublePrecision("size_mm"),
    note: text("note"),
    version: integer("version").notNull().default(1),
    /** Chosen by the client for a create, so a retry after a lost answer finds the lesion it
     *  already made instead of making a second one. Unique per visit; null for older rows. */
    clientKey: uuid("client_key"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index("lesions_visit_idx").on(t.visitId),
    index("lesions_track_idx").on(t.trackId),
    index("lesions_site_idx").on(t.siteId),
    uniqueIndex("lesions_visit_client_key_idx").on(t.visitId, t.clientKey),
  ],
);

/** At a follow-up visit, a previous track looked for and not found (or found treated away). */
export const trackChecks = pgTable(
  "track_checks",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
    trackId: uuid("track_id").notNull().references(() => lesionTracks.id),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    outcome: e.trackCheckEnum("outcome").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  // track_id: the timeline reads a patient's checks through its tracks; deleting a track checks it.
  (t) => [unique("track_checks_visit_track").on(t.visitId, t.trackId), index("track_checks_track_idx").on(t.trackId)],
);

/**
 * A lesion drawn fresh at a follow-up visit that the examiner decided is new, not an earlier track
 * found again: it is no longer offered for linking, for anyone who opens the visit.
 */
export const keptNewLesions = pgTable("kept_new_lesions", {
  lesionId: uuid("lesion_id").primaryKey().references(() => lesions.id, { onDelete: "cascade" }),
  visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
  siteId: uuid("site_id").notNull().references(() => sites.id),
  decidedBy: text("decided_by").notNull().references(() => users.id),
  decidedAt: timestamp("decided_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index("kept_new_lesions_visit_idx").on(t.visitId)]);

/** Derived: each track's status at each visit (lib/tracking), refreshed on every write. */
export const trackStatuses = pgTable(
  "track_statuses",
  {
    trackId: uuid("track_id").notNull().references(() => lesionTracks.id, { onDelete: "cascade" }),
    visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    status: e.trackStatusEnum("status").notNull(),
    effectiveGrade: e.gradeEnum("effective_grade"),
    reason: text("reason").notNull(),
  },
  (t) => [unique("track_statuses_pk").on(t.trackId, t.visitId), index("track_statuses_visit_idx").on(t.visitId)],
);

export const biopsies = pgTable(
  "biopsies",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    lesionId: uuid("lesion_id").references(() => lesions.id, { onDelete: "set null" }),
    /** A, B, C… per visit, as printed on the requisition. */
    specimenLabel: char("specimen_label", { length: 1 }).notNull(),
    clockH: doublePrecision("clock_h").notNull(),
    distanceCm: doublePrecision("distance_cm").notNull(),
    histology: e.histologyEnum("histology"),
    ainGrade: e.ainEnum("ain_grade"),
    p16: e.p16Enum("p16"),
    resultEnteredAt: timestamp("result_entered_at", { withTimezone: true }),
    resultEnteredBy: text("result_entered_by").references(() => users.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("biopsies_visit_label").on(t.visitId, t.specimenLabel), index("biopsies_lesion_idx").on(t.lesionId)],
);

export const treatments = pgTable(
  "treatments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    lesionId: uuid("lesion_id").references(() => lesions.id, { onDelete: "set null" }),
    modality: e.modalityEnum("modality").notNull(),
    regimen: text("regimen"),
    /** Treated extent as clockwise arcs [{startH, endH}] in the stored frame. */
    arcs: jsonb("arcs").$type<{ startH: number; endH: number }[]>().notNull().default([]),
    /**
     * The lesions of the visit this treatment treated: the named lesion, every lesion whose clock
     * extent the arcs cover fully, and those they cover in part that the clinician confirmed
     * (lib/validation/treatments.ts, treatedLesions). Track statuses read this, not the geometry.
     */
    treatedLesionIds: uuid("treated_lesion_ids").array().notNull().default(sql`'{}'::uuid[]`),
    /** The treated fraction of the circumference, recomputed by the server on every write. */
    treatedFraction: doublePrecision("treated_fraction").notNull().default(0),
    extentOverrideReason: text("extent_override_reason"),
    /** Why a lesion suspected or proven to be cancer was treated; required for such a treatment. */
    cancerOverrideReason: text("cancer_override_reason"),
    note: text("note"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  // lesion_id: every lesion read asks whether it was treated, and deleting a lesion nulls it here.
  (t) => [index("treatments_visit_idx").on(t.visitId), index("treatments_lesion_idx").on(t.lesionId)],
);

export const anaestheticDoses = pgTable("anaesthetic_doses", {
  id: uuid("id").primaryKey().defaultRandom(),
  visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
  siteId: uuid("site_id").notNull().references(() => sites.id),
  agent: e.agentEnum("agent").notNull(),
  concentrationPct: doublePrecision("concentration_pct").notNull(),
  volumeMl: doublePrecision("volume_ml").notNull(),
  withEpinephrine: boolean("with_epinephrine").notNull(),
  /** Computed by the server (concentration % × 10 × mL), never taken from the client. */
  doseMg: doublePrecision("dose_mg").notNull(),
  overrideReason: text("override_reason"),
  overriddenBy: text("overridden_by").references(() => users.id),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export const addenda = pgTable("addenda", {
  id: uuid("id").primaryKey().defaultRandom(),
  visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
  siteId: uuid("site_id").notNull().references(() => sites.id),
  authorId: text("author_id").notNull().references(() => users.id),
  body: text("body").notNull(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

/** ICD-10-CM codes the clinician confirmed for a visit. */
export const visitDiagnoses = pgTable(
  "visit_diagnoses",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    code: text("code").notNull(),
    descriptor: text("descriptor").notNull(),
    confirmedBy: text("confirmed_by").notNull().references(() => users.id),
    confirmedAt: timestamp("confirmed_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("visit_diagnoses_code").on(t.visitId, t.code)],
);

export const attachments = pgTable(
  "attachments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    visitId: uuid("visit_id").notNull().references(() => visits.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    lesionId: uuid("lesion_id").references(() => lesions.id, { onDelete: "set null" }),
    /** Set when the file was added after signing: the addendum it belongs to. */
    addendumId: uuid("addendum_id").references(() => addenda.id),
    kind: e.attachmentKindEnum("kind").notNull(),
    contentType: text("content_type").notNull(),
    byteSize: integer("byte_size").notNull(),
    sha256: text("sha256").notNull(),
    objectKey: text("object_key").notNull().unique(),
    thumbKey: text("thumb_key"),
    caption: text("caption"),
    uploadedBy: text("uploaded_by").notNull().references(() => users.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("attachments_visit_idx").on(t.visitId)],
);

export const reviews = pgTable(
  "reviews",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id").notNull().references(() => patients.id),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    visitId: uuid("visit_id").notNull().references(() => visits.id),
    comparedVisitId: uuid("compared_visit_id").references(() => visits.id),
    reviewerId: text("reviewer_id").references(() => users.id),
    requestedBy: text("requested_by").references(() => users.id),
    status: e.reviewStatusEnum("status").notNull().default("requested"),
    signedOffAt: timestamp("signed_off_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  // The timeline lists a patient's reviews.
  (t) => [index("reviews_patient_idx").on(t.patientId)],
);

export const adjudications = pgTable(
  "adjudications",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    reviewId: uuid("review_id").notNull().references(() => reviews.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    trackId: uuid("track_id").notNull().references(() => lesionTracks.id),
    verdict: e.verdictEnum("verdict").notNull(),
    proposedStatus: e.trackStatusEnum("proposed_status"),
    comment: text("comment"),
    resolvedAt: timestamp("resolved_at", { withTimezone: true }),
    resolvedBy: text("resolved_by").references(() => users.id),
    /** Which view stands, recorded when the disagreement is resolved. */
    outcome: e.disagreementOutcomeEnum("outcome"),
    outcomeNote: text("outcome_note"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("adjudications_review_track").on(t.reviewId, t.trackId)],
);
