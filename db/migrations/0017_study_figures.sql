CREATE TABLE "study_figures" (
	"study_id" uuid NOT NULL,
	"site_id" uuid NOT NULL,
	"computed_at" timestamp with time zone NOT NULL,
	"figures" jsonb NOT NULL,
	CONSTRAINT "study_figures_study_id_site_id_pk" PRIMARY KEY("study_id","site_id")
);
--> statement-breakpoint
ALTER TABLE "study_figures" ADD CONSTRAINT "study_figures_study_id_studies_id_fk" FOREIGN KEY ("study_id") REFERENCES "public"."studies"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "study_figures" ADD CONSTRAINT "study_figures_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;