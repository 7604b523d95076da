import { z } from "zod";
import { text } from "@/lib/validation/text";
import { DISAGREEMENT_OUTCOMES, TRACK_CHECK_OUTCOMES, TRACK_STATUSES, VERDICTS } from "@/lib/domain/vocab";

const id = (what: string) => text().uuid(`Not a valid ${what}.`);

/** The clinician confirms, relinks, splits or merges tracks, marks earlier tracks not found, and keeps fresh lesions as new. */
export const trackActionSchema = z.discriminatedUnion(
  "action",
  [
    z.object({ action: z.literal("link"), lesionId: id("lesion"), trackId: id("track") }),
    z.object({ action: z.literal("split"), lesionId: id("lesion") }),
    z.object({ action: z.literal("merge"), trackId: id("track"), intoTrackId: id("track") }),
    z.object({ action: z.literal("check"), trackId: id("track"), outcome: z.enum(TRACK_CHECK_OUTCOMES, { message: "Choose not found, treated or not examined." }) }),
    z.object({ action: z.literal("uncheck"), trackId: id("track") }),
    // A lesion drawn fresh here is a new lesion, not an earlier track found again (and undoing that).
    z.object({ action: z.literal("keep_new"), lesionId: id("lesion") }),
    z.object({ action: z.literal("unkeep_new"), lesionId: id("lesion") }),
  ],
  { message: "Choose link, split, merge, check, uncheck, keep_new or unkeep_new." },
);
export type TrackAction = z.infer<typeof trackActionSchema>;

export const requestReviewSchema = z.object({
  visitId: id("visit"),
  comparedVisitId: id("visit").nullable().optional(),
  reviewerId: text().min(1, "Choose a reviewer.").max(100),
});

export const adjudicationSchema = z
  .object({
    trackId: id("track"),
    verdict: z.enum(VERDICTS, { message: "Choose agree, disagree or not examined." }),
    proposedStatus: z.enum(TRACK_STATUSES, { message: "Choose the status you believe." }).nullable().optional(),
    comment: text().trim().max(2000, "Keep the comment under 2,000 characters.").nullable().optional(),
  })
  .refine((a) => a.verdict !== "disagree" || (a.proposedStatus && a.comment), {
    message: "A disagreement needs the status you believe and a comment.",
    path: ["comment"],
  });
export type AdjudicationInput = z.infer<typeof adjudicationSchema>;

/** Resolving a reviewer's disagreement: which status stands, and optionally why. */
export const resolveDisagreementSchema = z.object({
  outcome: z.enum(DISAGREEMENT_OUTCOMES, { message: "Choose which status stands." }),
  note: text().trim().max(2000, "Keep the note under 2,000 characters.").nullable().optional(),
});
export type ResolveDisagreementInput = z.infer<typeof resolveDisagreementSchema>;
