ALTER TABLE "lesions" ADD COLUMN "client_key" uuid;--> statement-breakpoint
CREATE UNIQUE INDEX "lesions_visit_client_key_idx" ON "lesions" USING btree ("visit_id","client_key");