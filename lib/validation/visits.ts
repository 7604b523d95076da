import { z } from "zod";
import { POSITIONS } from "@/lib/domain/vocab";

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2026-03-14.").refine((s) => !Number.isNaN(Date.parse(s)), "Not a real date.");

export const createVisitSchema = z.object({
  visitDate: isoDate,
  patientPosition: z.enum(POSITIONS, { message: "Choose lithotomy, prone jack-knife or left lateral." }),
  indication: z.string().trim().max(2000, "Keep the indication under 2,000 characters.").optional(),
});
export type CreateVisitInput = z.infer<typeof createVisitSchema>;

export const preferencesSchema = z.object({
  displayConvention: z.enum(POSITIONS, { message: "Choose lithotomy, prone jack-knife or left lateral." }),
});
