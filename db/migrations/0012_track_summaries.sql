CREATE TABLE "track_summaries" (
	"track_id" uuid PRIMARY KEY NOT NULL,
	"site_id" uuid NOT NULL,
	"first_seen" date,
	"first_diseased" date,
	"earlier_disease_elsewhere" boolean NOT NULL
);
--> statement-breakpoint
ALTER TABLE "track_summaries" ADD CONSTRAINT "track_summaries_track_id_lesion_tracks_id_fk" FOREIGN KEY ("track_id") REFERENCES "public"."lesion_tracks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "track_summaries" ADD CONSTRAINT "track_summaries_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE no action ON UPDATE no action;