import { sql } from "drizzle-orm";
import { bigserial, date, index, integer, jsonb, pgTable, primaryKey, text, timestamp, unique, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { sites } from "./accounts";
import { patients } from "./clinical";
import { outboxStatusEnum } from "./enums";

export const studies = pgTable("studies", {
  id: uuid("id").primaryKey().defaultRandom(),
  code: text("code").notNull().unique(),
  title: text("title").notNull(),
  startDate: date("start_date").notNull(),
  /** The consent form in use now; a consent records the version the patient signed. */
  consentFormVersion: text("consent_form_version").notNull().default("1"),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

export const studySites = pgTable(
  "study_sites",
  {
    studyId: uuid("study_id").notNull().references(() => studies.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id),
  },
  (t) => [primaryKey({ columns: [t.studyId, t.siteId] })],
);

export const enrolments = pgTable(
  "enrolments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    studyId: uuid("study_id").notNull().references(() => studies.id),
    patientId: uuid("patient_id").notNull().references(() => patients.id),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    /** The only patient identifier a research nurse sees. */
    studySubjectId: text("study_subject_id").notNull(),
    consentDate: date("consent_date").notNull(),
    withdrawnOn: date("withdrawn_on"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique("enrolments_study_patient").on(t.studyId, t.patientId), unique("enrolments_study_subject").on(t.studyId, t.studySubjectId)],
);

/** A patient's research consent to one study, and its withdrawal; enrolment requires a current one. */
export const researchConsents = pgTable(
  "research_consents",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    patientId: uuid("patient_id").notNull().references(() => patients.id),
    studyId: uuid("study_id").notNull().references(() => studies.id),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    consentedOn: date("consented_on").notNull(),
    formVersion: text("form_version").notNull(),
    recordedBy: text("recorded_by").notNull(),
    withdrawnOn: date("withdrawn_on"),
    withdrawnBy: text("withdrawn_by"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("research_consents_current").on(t.patientId, t.studyId).where(sql`${t.withdrawnOn} is null`),
    index("research_consents_study_idx").on(t.studyId),
  ],
);

/** Append-only: the app never updates or deletes these rows (a trigger refuses it). */
export const auditEvents = pgTable(
  "audit_events",
  {
    id: bigserial("id", { mode: "number" }).primaryKey(),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
    userId: text("user_id"),
    siteId: uuid("site_id"),
    patientId: uuid("patient_id"),
    action: text("action").notNull(),
    entityType: text("entity_type"),
    entityId: text("entity_id"),
    ip: text("ip"),
    detail: jsonb("detail"),
  },
  (t) => [index("audit_at_idx").on(t.at), index("audit_patient_idx").on(t.patientId), index("audit_user_idx").on(t.userId)],
);

/** Outgoing mail, written first and sent by a worker with retries; the key makes sending idempotent. */
export const mailOutbox = pgTable(
  "mail_outbox",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    idempotencyKey: text("idempotency_key").notNull().unique(),
    toAddress: text("to_address").notNull(),
    subject: text("subject").notNull(),
    textBody: text("text_body").notNull(),
    status: outboxStatusEnum("status").notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    nextAttemptAt: timestamp("next_attempt_at", { withTimezone: true }).notNull().defaultNow(),
    lastError: text("last_error"),
    sentAt: timestamp("sent_at", { withTimezone: true }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("mail_outbox_pending_idx").on(t.status, t.nextAttemptAt)],
);

/**
 * The study dashboard's figures per study and site, worked out by the exports' own statements
 * (lib/server/study-figures.ts) and kept here so the dashboard answers in milliseconds at any
 * registry size. `computedAt` is shown on screen; a load after the documented age starts a refresh.
 */
export const studyFigures = pgTable(
  "study_figures",
  {
    studyId: uuid("study_id").notNull().references(() => studies.id, { onDelete: "cascade" }),
    siteId: uuid("site_id").notNull().references(() => sites.id),
    computedAt: timestamp("computed_at", { withTimezone: true }).notNull(),
    figures: jsonb("figures").notNull(),
  },
  (t) => [primaryKey({ columns: [t.studyId, t.siteId] })],
);

/** The clinic-quality panel's figures per site, calendar year and cytology look-back window (lib/server/research.ts). */
export const qualityFigures = pgTable(
  "quality_figures",
  {
    siteId: uuid("site_id").notNull().references(() => sites.id),
    year: integer("year").notNull(),
    windowDays: integer("window_days").notNull(),
    computedAt: timestamp("computed_at", { withTimezone: true }).notNull(),
    figures: jsonb("figures").notNull(),
  },
  (t) => [primaryKey({ columns: [t.siteId, t.year, t.windowDays] })],
);
