import { z } from "zod";
import { text } from "@/lib/validation/text";

export interface OverrideState {
  ok?: boolean;
  message?: string;
  fields?: Record<string, string[]>;
}

export const overrideDueSchema = z.discriminatedUnion("mode", [
  z.object({
    mode: z.literal("set"),
    patientId: text().uuid(),
    date: text().regex(/^\d{4}-\d{2}-\d{2}$/, "Choose a date.").refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)), "Choose a real date."),
    reason: text().trim().min(3, "Say why this date (the audit trail keeps it).").max(500, "Keep the reason under 500 characters."),
  }),
  z.object({ mode: z.literal("clear"), patientId: text().uuid() }),
]);
