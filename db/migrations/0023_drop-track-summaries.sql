-- Track summaries served only the incremental status refresh of lesion writes. Lesions are written on
-- drafts, which drive no status (0022), so no write refreshes part of a patient any more: every
-- refresh reads the whole history, and the summaries have no reader.
DROP TABLE "track_summaries" CASCADE;