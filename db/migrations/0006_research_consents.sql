CREATE TABLE "research_consents" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"patient_id" uuid NOT NULL,
	"study_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"consented_on" date NOT NULL,
	"form_version" text NOT NULL,
	"recorded_by" text NOT NULL,
	"withdrawn_on" date,
	"withdrawn_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "studies" ADD COLUMN "consent_form_version" text DEFAULT '1' NOT NULL;--> statement-breakpoint
ALTER TABLE "research_consents" ADD CONSTRAINT "research_consents_patient_id_patients_id_fk" FOREIGN KEY ("patient_id") REFERENCES "public"."patients"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "research_consents" ADD CONSTRAINT "research_consents_study_id_studies_id_fk" FOREIGN KEY ("study_id") REFERENCES "public"."studies"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "research_consents" ADD CONSTRAINT "research_consents_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "research_consents_current" ON "research_consents" USING btree ("patient_id","study_id") WHERE "research_consents"."withdrawn_on" is null;--> statement-breakpoint
CREATE INDEX "research_consents_study_idx" ON "research_consents" USING btree ("study_id");--> statement-breakpoint
-- An enrolment was made on a recorded consent: carry those over, withdrawals included.
INSERT INTO "research_consents" ("patient_id", "study_id", "site_id", "consented_on", "form_version", "recorded_by", "withdrawn_on", "withdrawn_by")
SELECT "patient_id", "study_id", "site_id", "consent_date", '1', 'migration', "withdrawn_on", CASE WHEN "withdrawn_on" IS NOT NULL THEN 'migration' END FROM "enrolments";
