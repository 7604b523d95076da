import { z } from "zod";
import { reasonSchema, text } from "@/lib/validation/text";
import { POSITIONS } from "@/lib/domain/vocab";
import { careDateSchema } from "./dates";

const isoDate = careDateSchema();

export const createVisitSchema = z.object({
  visitDate: isoDate,
  patientPosition: z.enum(POSITIONS, { message: "Choose lithotomy, prone jack-knife or left lateral." }),
  indication: text().trim().max(2000, "Keep the indication under 2,000 characters.").optional(),
});
export type CreateVisitInput = z.infer<typeof createVisitSchema>;

export const preferencesSchema = z.object({
  displayConvention: z.enum(POSITIONS, { message: "Choose lithotomy, prone jack-knife or left lateral." }),
});

/** Discarding a draft visit started by mistake: the reason goes into the audit log. */
export const discardVisitSchema = z.object({ reason: reasonSchema });
export type DiscardVisitInput = z.infer<typeof discardVisitSchema>;
