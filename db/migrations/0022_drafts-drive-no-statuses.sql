-- Track statuses are worked out from signed visits only (lib/tracking/histories.ts): a draft neither
-- clears nor finds anything. Rows stored at drafts go; the per-track summaries go too, so the next
-- status refresh of each patient recomputes every track from its signed visits (track-statuses.ts
-- does that for any patient with a track not summarised). Stored study figures go as well (a visit
-- with a track marked not examined is no clearance), and the clinic quality figures with them: the
-- next load works them out again.
DELETE FROM "track_statuses" ts USING "visits" v WHERE v."id" = ts."visit_id" AND v."status" = 'draft';--> statement-breakpoint
DELETE FROM "track_summaries";--> statement-breakpoint
DELETE FROM "study_figures";--> statement-breakpoint
DELETE FROM "quality_figures";
