CREATE TYPE "public"."acetowhite" AS ENUM('none', 'faint', 'dense');--> statement-breakpoint
CREATE TYPE "public"."adequacy" AS ENUM('scj_full', 'scj_partial', 'scj_not_seen');--> statement-breakpoint
CREATE TYPE "public"."anaesthetic_agent" AS ENUM('lidocaine', 'bupivacaine');--> statement-breakpoint
CREATE TYPE "public"."ain_grade" AS ENUM('ain1', 'ain2', 'ain3');--> statement-breakpoint
CREATE TYPE "public"."attachment_kind" AS ENUM('photo', 'document');--> statement-breakpoint
CREATE TYPE "public"."complication_kind" AS ENUM('pain', 'bleeding', 'other');--> statement-breakpoint
CREATE TYPE "public"."cytology" AS ENUM('nilm', 'asc_us', 'asc_h', 'lsil', 'hsil', 'scc', 'unsatisfactory', 'not_done');--> statement-breakpoint
CREATE TYPE "public"."grade" AS ENUM('benign', 'condyloma', 'lsil', 'hsil', 'suspected_cancer');--> statement-breakpoint
CREATE TYPE "public"."histology" AS ENUM('benign', 'lsil', 'hsil', 'scc');--> statement-breakpoint
CREATE TYPE "public"."hiv_status" AS ENUM('positive', 'negative', 'unknown');--> statement-breakpoint
CREATE TYPE "public"."hpv_result" AS ENUM('not_done', 'negative', 'hr_positive_16', 'hr_positive_other', 'lr_positive');--> statement-breakpoint
CREATE TYPE "public"."lugol" AS ENUM('not_applied', 'negative', 'partial', 'positive');--> statement-breakpoint
CREATE TYPE "public"."modality" AS ENUM('electrocautery', 'infrared_coagulation', 'laser', 'surgical_excision', 'topical_imiquimod', 'topical_fluorouracil', 'topical_cidofovir', 'other');--> statement-breakpoint
CREATE TYPE "public"."morphology" AS ENUM('flat', 'raised', 'papillary', 'ulcerated');--> statement-breakpoint
CREATE TYPE "public"."outbox_status" AS ENUM('pending', 'sent', 'failed');--> statement-breakpoint
CREATE TYPE "public"."p16" AS ENUM('block_positive', 'not_block', 'negative', 'not_done');--> statement-breakpoint
CREATE TYPE "public"."patient_position" AS ENUM('lithotomy', 'prone_jackknife', 'left_lateral');--> statement-breakpoint
CREATE TYPE "public"."review_status" AS ENUM('requested', 'in_progress', 'signed_off');--> statement-breakpoint
CREATE TYPE "public"."risk_group" AS ENUM('msm_tw_hiv', 'other_hiv', 'msm_tw_no_hiv', 'solid_organ_transplant', 'vulvar_hsil_or_cancer', 'cervical_vaginal_hsil_or_cancer', 'perianal_warts', 'persistent_cervical_hpv16', 'other');--> statement-breakpoint
CREATE TYPE "public"."role" AS ENUM('clinician', 'reviewer', 'research_nurse', 'admin');--> statement-breakpoint
CREATE TYPE "public"."severity" AS ENUM('mild', 'moderate', 'severe');--> statement-breakpoint
CREATE TYPE "public"."sex_at_birth" AS ENUM('female', 'male', 'intersex', 'unknown');--> statement-breakpoint
CREATE TYPE "public"."track_check_outcome" AS ENUM('not_found', 'treated');--> statement-breakpoint
CREATE TYPE "public"."track_status" AS ENUM('new', 'persistent', 'regressed', 'progressed', 'cleared', 'recurrent');--> statement-breakpoint
CREATE TYPE "public"."verdict" AS ENUM('agree', 'disagree');--> statement-breakpoint
CREATE TYPE "public"."visit_status" AS ENUM('draft', 'signed');--> statement-breakpoint
CREATE TYPE "public"."zone" AS ENUM('perianal', 'distal_canal', 'transformation_zone', 'proximal_canal', 'distal_rectum');--> statement-breakpoint
CREATE TABLE "invitations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"site_id" uuid NOT NULL,
	"role" "role" NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	"invited_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invitations_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "password_resets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"user_id" text NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "password_resets_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "rate_limits" (
	"key" text PRIMARY KEY NOT NULL,
	"window_start" timestamp with time zone NOT NULL,
	"count" integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sessions" (
	"id" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sites" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"name" text NOT NULL,
	"zone_bounds" jsonb,
	"followup_rules" jsonb,
	"extent_caution_fraction" double precision,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sites_code_unique" UNIQUE("code")
);
--> statement-breakpoint
CREATE TABLE "user_sites" (
	"user_id" text NOT NULL,
	"site_id" uuid NOT NULL,
	CONSTRAINT "user_sites_user_id_site_id_pk" PRIMARY KEY("user_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" text PRIMARY KEY NOT NULL,
	"email" text NOT NULL,
	"display_name" text NOT NULL,
	"password_hash" text,
	"role" "role" NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"display_convention" "patient_position" DEFAULT 'lithotomy' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "users_email_unique" UNIQUE("email")
);
--> statement-breakpoint
CREATE TABLE "addenda" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"author_id" text NOT NULL,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "adjudications" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"review_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"track_id" uuid NOT NULL,
	"verdict" "verdict" NOT NULL,
	"proposed_status" "track_status",
	"comment" text,
	"resolved_at" timestamp with time zone,
	"resolved_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "adjudications_review_track" UNIQUE("review_id","track_id")
);
--> statement-breakpoint
CREATE TABLE "anaesthetic_doses" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"agent" "anaesthetic_agent" NOT NULL,
	"concentration_pct" double precision NOT NULL,
	"volume_ml" double precision NOT NULL,
	"with_epinephrine" boolean NOT NULL,
	"dose_mg" double precision NOT NULL,
	"override_reason" text,
	"overridden_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "attachments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"lesion_id" uuid,
	"kind" "attachment_kind" NOT NULL,
	"content_type" text NOT NULL,
	"byte_size" integer NOT NULL,
	"sha256" text NOT NULL,
	"object_key" text NOT NULL,
	"thumb_key" text,
	"caption" text,
	"uploaded_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "attachments_object_key_unique" UNIQUE("object_key")
);
--> statement-breakpoint
CREATE TABLE "biopsies" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"lesion_id" uuid,
	"specimen_label" char(1) NOT NULL,
	"clock_h" double precision NOT NULL,
	"distance_cm" double precision NOT NULL,
	"histology" "histology",
	"ain_grade" "ain_grade",
	"p16" "p16",
	"result_entered_at" timestamp with time zone,
	"result_entered_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "biopsies_visit_label" UNIQUE("visit_id","specimen_label")
);
--> statement-breakpoint
CREATE TABLE "complications" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"kind" "complication_kind" NOT NULL,
	"severity" "severity" NOT NULL,
	"after_procedure" boolean DEFAULT false NOT NULL,
	"note" text
);
--> statement-breakpoint
CREATE TABLE "lesion_tracks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"label" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "tracks_patient_label" UNIQUE("patient_id","label")
);
--> statement-breakpoint
CREATE TABLE "lesions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"track_id" uuid,
	"label" text NOT NULL,
	"clock_start_h" double precision NOT NULL,
	"clock_end_h" double precision NOT NULL,
	"distance_start_cm" double precision NOT NULL,
	"distance_end_cm" double precision NOT NULL,
	"zone" "zone" NOT NULL,
	"grade" "grade" NOT NULL,
	"morphology" "morphology",
	"acetowhite" "acetowhite",
	"lugol" "lugol",
	"vessels" text[] DEFAULT '{}' NOT NULL,
	"size_mm" double precision,
	"note" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "patients" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"mrn" text NOT NULL,
	"family_name" text NOT NULL,
	"given_name" text NOT NULL,
	"date_of_birth" date NOT NULL,
	"sex_at_birth" "sex_at_birth" NOT NULL,
	"gender_identity" text,
	"hiv_status" "hiv_status" DEFAULT 'unknown' NOT NULL,
	"risk_group" "risk_group" DEFAULT 'other' NOT NULL,
	"risk_date" date,
	"zip" text,
	"contact_email" text,
	"consent_email" boolean DEFAULT false NOT NULL,
	"consent_research" boolean DEFAULT false NOT NULL,
	"clinician_id" text,
	"next_due_override" date,
	"next_due_override_reason" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "patients_site_mrn" UNIQUE("site_id","mrn")
);
--> statement-breakpoint
CREATE TABLE "reviews" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"visit_id" uuid NOT NULL,
	"compared_visit_id" uuid,
	"reviewer_id" text,
	"requested_by" text,
	"status" "review_status" DEFAULT 'requested' NOT NULL,
	"signed_off_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "track_checks" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"track_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"outcome" "track_check_outcome" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "track_checks_visit_track" UNIQUE("visit_id","track_id")
);
--> statement-breakpoint
CREATE TABLE "track_statuses" (
	"track_id" uuid NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"status" "track_status" NOT NULL,
	"effective_grade" "grade",
	"reason" text NOT NULL,
	CONSTRAINT "track_statuses_pk" UNIQUE("track_id","visit_id")
);
--> statement-breakpoint
CREATE TABLE "treatments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"lesion_id" uuid,
	"modality" "modality" NOT NULL,
	"regimen" text,
	"arcs" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"treated_fraction" double precision DEFAULT 0 NOT NULL,
	"extent_override_reason" text,
	"note" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "visit_diagnoses" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"code" text NOT NULL,
	"descriptor" text NOT NULL,
	"confirmed_by" text NOT NULL,
	"confirmed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "visit_diagnoses_code" UNIQUE("visit_id","code")
);
--> statement-breakpoint
CREATE TABLE "visits" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"visit_date" date NOT NULL,
	"examiner_id" text NOT NULL,
	"patient_position" "patient_position" DEFAULT 'lithotomy' NOT NULL,
	"indication" text,
	"cytology" "cytology" DEFAULT 'not_done' NOT NULL,
	"hpv_result" "hpv_result" DEFAULT 'not_done' NOT NULL,
	"adequacy" "adequacy",
	"exam_started_at" timestamp with time zone,
	"exam_ended_at" timestamp with time zone,
	"anaesthesia" text,
	"patient_weight_kg" double precision,
	"plan" text,
	"status" "visit_status" DEFAULT 'draft' NOT NULL,
	"signed_at" timestamp with time zone,
	"signed_by" text,
	"version" integer DEFAULT 1 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "audit_events" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"user_id" text,
	"site_id" uuid,
	"patient_id" uuid,
	"action" text NOT NULL,
	"entity_type" text,
	"entity_id" text,
	"ip" text,
	"detail" jsonb
);
--> statement-breakpoint
CREATE TABLE "enrolments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"study_id" uuid NOT NULL,
	"patient_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"study_subject_id" text NOT NULL,
	"consent_date" date NOT NULL,
	"withdrawn_on" date,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "enrolments_study_patient" UNIQUE("study_id","patient_id"),
	CONSTRAINT "enrolments_study_subject" UNIQUE("study_id","study_subject_id")
);
--> statement-breakpoint
CREATE TABLE "mail_outbox" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"idempotency_key" text NOT NULL,
	"to_address" text NOT NULL,
	"subject" text NOT NULL,
	"text_body" text NOT NULL,
	"status" "outbox_status" DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"next_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_error" text,
	"sent_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "mail_outbox_idempotency_key_unique" UNIQUE("idempotency_key")
);
--> statement-breakpoint
CREATE TABLE "studies" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"code" text NOT NULL,
	"title" text NOT NULL,
	"start_date" date NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "studies_code_unique" UNIQUE("code")
);
--> statement-breakpoint
CREATE TABLE "study_sites" (
	"study_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	CONSTRAINT "study_sites_study_id_site_id_pk" PRIMARY KEY("study_id","site_id")
);
--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_invited_by_users_id_fk" FOREIGN KEY ("invited_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "password_resets" ADD CONSTRAINT "password_resets_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sessions" ADD CONSTRAINT "sessions_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "user_sites" ADD CONSTRAINT "user_sites_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "user_sites" ADD CONSTRAINT "user_sites_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "addenda" ADD CONSTRAINT "addenda_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "addenda" ADD CONSTRAINT "addenda_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "addenda" ADD CONSTRAINT "addenda_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "adjudications" ADD CONSTRAINT "adjudications_review_id_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."reviews"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "adjudications" ADD CONSTRAINT "adjudications_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "adjudications" ADD CONSTRAINT "adjudications_track_id_lesion_tracks_id_fk" FOREIGN KEY ("track_id") REFERENCES "public"."lesion_tracks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "adjudications" ADD CONSTRAINT "adjudications_resolved_by_users_id_fk" FOREIGN KEY ("resolved_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "anaesthetic_doses" ADD CONSTRAINT "anaesthetic_doses_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "anaesthetic_doses" ADD CONSTRAINT "anaesthetic_doses_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "anaesthetic_doses" ADD CONSTRAINT "anaesthetic_doses_overridden_by_users_id_fk" FOREIGN KEY ("overridden_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_lesion_id_lesions_id_fk" FOREIGN KEY ("lesion_id") REFERENCES "public"."lesions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachments" ADD CONSTRAINT "attachments_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "biopsies" ADD CONSTRAINT "biopsies_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "biopsies" ADD CONSTRAINT "biopsies_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "biopsies" ADD CONSTRAINT "biopsies_lesion_id_lesions_id_fk" FOREIGN KEY ("lesion_id") REFERENCES "public"."lesions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "biopsies" ADD CONSTRAINT "biopsies_result_entered_by_users_id_fk" FOREIGN KEY ("result_entered_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "complications" ADD CONSTRAINT "complications_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "complications" ADD CONSTRAINT "complications_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lesion_tracks" ADD CONSTRAINT "lesion_tracks_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lesion_tracks" ADD CONSTRAINT "lesion_tracks_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lesions" ADD CONSTRAINT "lesions_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lesions" ADD CONSTRAINT "lesions_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lesions" ADD CONSTRAINT "lesions_track_id_lesion_tracks_id_fk" FOREIGN KEY ("track_id") REFERENCES "public"."lesion_tracks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patients" ADD CONSTRAINT "patients_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "patients" ADD CONSTRAINT "patients_clinician_id_users_id_fk" FOREIGN KEY ("clinician_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_compared_visit_id_visits_id_fk" FOREIGN KEY ("compared_visit_id") REFERENCES "public"."visits"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_reviewer_id_users_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_checks" ADD CONSTRAINT "track_checks_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_checks" ADD CONSTRAINT "track_checks_track_id_lesion_tracks_id_fk" FOREIGN KEY ("track_id") REFERENCES "public"."lesion_tracks"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_checks" ADD CONSTRAINT "track_checks_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_statuses" ADD CONSTRAINT "track_statuses_track_id_lesion_tracks_id_fk" FOREIGN KEY ("track_id") REFERENCES "public"."lesion_tracks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_statuses" ADD CONSTRAINT "track_statuses_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_statuses" ADD CONSTRAINT "track_statuses_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "treatments" ADD CONSTRAINT "treatments_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "treatments" ADD CONSTRAINT "treatments_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "treatments" ADD CONSTRAINT "treatments_lesion_id_lesions_id_fk" FOREIGN KEY ("lesion_id") REFERENCES "public"."lesions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_diagnoses" ADD CONSTRAINT "visit_diagnoses_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_diagnoses" ADD CONSTRAINT "visit_diagnoses_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visit_diagnoses" ADD CONSTRAINT "visit_diagnoses_confirmed_by_users_id_fk" FOREIGN KEY ("confirmed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_examiner_id_users_id_fk" FOREIGN KEY ("examiner_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "visits" ADD CONSTRAINT "visits_signed_by_users_id_fk" FOREIGN KEY ("signed_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "enrolments" ADD CONSTRAINT "enrolments_study_id_studies_id_fk" FOREIGN KEY ("study_id") REFERENCES "public"."studies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "enrolments" ADD CONSTRAINT "enrolments_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "enrolments" ADD CONSTRAINT "enrolments_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_sites" ADD CONSTRAINT "study_sites_study_id_studies_id_fk" FOREIGN KEY ("study_id") REFERENCES "public"."studies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_sites" ADD CONSTRAINT "study_sites_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "sessions_user_idx" ON "sessions" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "user_sites_site_idx" ON "user_sites" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "attachments_visit_idx" ON "attachments" USING btree ("visit_id");--> statement-breakpoint
CREATE INDEX "biopsies_lesion_idx" ON "biopsies" USING btree ("lesion_id");--> statement-breakpoint
CREATE INDEX "lesions_visit_idx" ON "lesions" USING btree ("visit_id");--> statement-breakpoint
CREATE INDEX "lesions_track_idx" ON "lesions" USING btree ("track_id");--> statement-breakpoint
CREATE INDEX "lesions_site_idx" ON "lesions" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "patients_site_name_idx" ON "patients" USING btree ("site_id","family_name","given_name");--> statement-breakpoint
CREATE INDEX "track_statuses_visit_idx" ON "track_statuses" USING btree ("visit_id");--> statement-breakpoint
CREATE INDEX "treatments_visit_idx" ON "treatments" USING btree ("visit_id");--> statement-breakpoint
CREATE INDEX "visits_patient_date_idx" ON "visits" USING btree ("patient_id","visit_date");--> statement-breakpoint
CREATE INDEX "visits_site_date_idx" ON "visits" USING btree ("site_id","visit_date");--> statement-breakpoint
CREATE INDEX "audit_at_idx" ON "audit_events" USING btree ("at");--> statement-breakpoint
CREATE INDEX "audit_patient_idx" ON "audit_events" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "audit_user_idx" ON "audit_events" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "mail_outbox_pending_idx" ON "mail_outbox" USING btree ("status","next_attempt_at");