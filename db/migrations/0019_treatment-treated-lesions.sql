ALTER TABLE "treatments" ADD COLUMN "treated_lesion_ids" uuid[] DEFAULT '{}'::uuid[] NOT NULL;--> statement-breakpoint
-- Treatments stored before this column named at most one lesion: that lesion is what they treated.
-- Arc-only treatments stored before it get no lesions here: whether their arcs cover a lesion fully
-- or in part is the clinician's decision on the treatment form, not one to guess afterwards.
UPDATE "treatments" SET "treated_lesion_ids" = ARRAY["lesion_id"] WHERE "lesion_id" IS NOT NULL;
