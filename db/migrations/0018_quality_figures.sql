CREATE TABLE "quality_figures" (
	"site_id" uuid NOT NULL,
	"year" integer NOT NULL,
	"window_days" integer NOT NULL,
	"computed_at" timestamp with time zone NOT NULL,
	"figures" jsonb NOT NULL,
	CONSTRAINT "quality_figures_site_id_year_window_days_pk" PRIMARY KEY("site_id","year","window_days")
);
--> statement-breakpoint
ALTER TABLE "quality_figures" ADD CONSTRAINT "quality_figures_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;