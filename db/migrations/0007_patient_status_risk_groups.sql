CREATE TYPE "public"."patient_status" AS ENUM('active', 'inactive', 'deceased');--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "risk_groups" "risk_group"[] DEFAULT '{}'::risk_group[] NOT NULL;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "status" "patient_status" DEFAULT 'active' NOT NULL;--> statement-breakpoint
ALTER TABLE "patients" ADD COLUMN "version" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
-- The single risk group becomes a one-element set.
UPDATE "patients" SET "risk_groups" = ARRAY["risk_group"];