CREATE INDEX "reviews_patient_idx" ON "reviews" USING btree ("patient_id");--> statement-breakpoint
CREATE INDEX "track_checks_track_idx" ON "track_checks" USING btree ("track_id");--> statement-breakpoint
CREATE INDEX "treatments_lesion_idx" ON "treatments" USING btree ("lesion_id");