import { z } from "zod";
import { REASON_RULE, reasonProblem, text } from "@/lib/validation/text";
import { GRADES } from "@/lib/domain/vocab";
import { toCalendarDate } from "@/lib/dates/calendar";

// Schemas for enrolment, withdrawal and export filters. Export filters end up as literals inside a
// COPY statement (COPY takes no bind parameters), so every field here is a closed shape: uuid,
// calendar date or enum. Nothing free-form ever reaches the SQL text.

const isCalendarDay = (s: string) => {
  try {
    toCalendarDate(s);
    return true;
  } catch {
    return false;
  }
};

export const isoDay = text({ message: "Enter a date." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Use the form YYYY-MM-DD.")
  .refine(isCalendarDay, "No such calendar day.");

/** Study subject IDs: letters, digits and hyphens, so they can never carry a name or free text. */
export const studySubjectIdSchema = text({ message: "Enter a study ID." })
  .trim()
  .regex(/^[A-Za-z0-9][A-Za-z0-9-]{0,31}$/, "Use up to 32 letters, digits and hyphens.");

export const enrolSchema = z.object({
  /** The opaque pick-list reference of a consenting patient (see db/queries/research/enrolment.ts). */
  candidateRef: text({ message: "Choose a patient from the list." }).regex(/^[0-9a-f]{12}$/, "Choose a patient from the list."),
  siteId: text({ message: "Choose a site." }).uuid("Choose a site."),
  studySubjectId: studySubjectIdSchema,
  consentDate: isoDay,
});
export type EnrolInput = z.infer<typeof enrolSchema>;

export const withdrawSchema = z.object({ withdrawnOn: isoDay });
export type WithdrawInput = z.infer<typeof withdrawSchema>;

export { reasonProblem };

export const EXPORT_DATASETS = ["counts", "lesions", "outcomes"] as const;
export type ExportDataset = (typeof EXPORT_DATASETS)[number];

export const exportFilterSchema = z
  .object({
    studyId: text({ message: "Choose a study." }).uuid("Choose a study."),
    siteId: text().uuid("Not a valid site.").optional(),
    from: isoDay.optional(),
    to: isoDay.optional(),
    grade: z.enum(GRADES, { message: "Unknown grade." }).optional(),
    /** Safe Harbor keeps either the year of each date or its day offset from enrolment. */
    dates: z.enum(["offset", "year"], { message: "Choose offset or year." }).default("offset"),
    identified: z.enum(["0", "1"]).default("0").transform((v) => v === "1"),
    reason: text().trim().max(500, "Keep the reason under 500 characters.").optional(),
  })
  .refine((f) => !f.from || !f.to || f.from <= f.to, { message: "The range must end on or after its start.", path: ["to"] })
  .superRefine((f, ctx) => {
    if (!f.identified) return;
    const problem = f.reason === undefined ? REASON_RULE : reasonProblem(f.reason);
    if (problem) ctx.addIssue({ code: "custom", message: problem, path: ["reason"] });
  });
export type ExportFilter = z.infer<typeof exportFilterSchema>;

export const datasetParam = z.enum(EXPORT_DATASETS);

export const qualityQuerySchema = z.object({
  year: z.coerce.number({ message: "Choose a year." }).int().min(2000, "Choose a year from 2000.").max(2100, "Choose a year before 2100."),
});
