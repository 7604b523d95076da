CREATE TYPE "public"."disagreement_outcome" AS ENUM('proposed_accepted', 'recorded_kept');--> statement-breakpoint
CREATE TABLE "kept_new_lesions" (
	"lesion_id" uuid PRIMARY KEY NOT NULL,
	"visit_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"decided_by" text NOT NULL,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "adjudications" ADD COLUMN "outcome" "disagreement_outcome";--> statement-breakpoint
ALTER TABLE "adjudications" ADD COLUMN "outcome_note" text;--> statement-breakpoint
ALTER TABLE "kept_new_lesions" ADD CONSTRAINT "kept_new_lesions_lesion_id_lesions_id_fk" FOREIGN KEY ("lesion_id") REFERENCES "public"."lesions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "kept_new_lesions" ADD CONSTRAINT "kept_new_lesions_visit_id_visits_id_fk" FOREIGN KEY ("visit_id") REFERENCES "public"."visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "kept_new_lesions" ADD CONSTRAINT "kept_new_lesions_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "kept_new_lesions" ADD CONSTRAINT "kept_new_lesions_decided_by_users_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "kept_new_lesions_visit_idx" ON "kept_new_lesions" USING btree ("visit_id");