import { z } from "zod";
import { text } from "@/lib/validation/text";
import { isoDay } from "./research";

const formVersion = text().trim().min(1, "Give the consent form's version.").max(40, "Keep the version under 40 characters.");

/** One schema for the study form and its routes. */
export const studySchema = z.object({
  code: text().trim().toUpperCase().regex(/^[A-Z0-9][A-Z0-9-]{1,23}$/, "A study code is 2 to 24 letters, digits or dashes."),
  title: text().trim().min(3, "Give the study's title.").max(200, "Keep the title under 200 characters."),
  siteIds: z.array(text().uuid("Not a site.")).min(1, "Choose at least one site.").max(50, "Too many sites."),
  startDate: isoDay,
  consentFormVersion: formVersion,
});
export type StudyInput = z.infer<typeof studySchema>;
export const studyUpdateSchema = studySchema.partial();
export type StudyUpdateInput = z.infer<typeof studyUpdateSchema>;

export const consentSchema = z.object({
  studyId: text().uuid("Choose a study."),
  consentedOn: isoDay,
  formVersion: formVersion.optional(),
});
export type ConsentInput = z.infer<typeof consentSchema>;

export const consentWithdrawSchema = z.object({ withdrawnOn: isoDay });
