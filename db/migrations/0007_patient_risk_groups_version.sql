ALTER TABLE "patients" ADD COLUMN "risk_groups" "risk_group"[] DEFAULT '{}'::risk_group[] NOT NULL;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "version" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
-- Patients registered before risk groups became a set keep the one group they had.
UPDATE "patients" SET "risk_groups" = ARRAY["risk_group"];
