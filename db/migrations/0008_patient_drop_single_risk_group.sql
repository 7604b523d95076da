CREATE INDEX "patients_site_dob_idx" ON "patients" USING btree ("site_id","date_of_birth");--> statement-breakpoint
ALTER TABLE "patients" DROP COLUMN "risk_group";