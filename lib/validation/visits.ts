import { z } from "zod";
import { POSITIONS } from "@/lib/domain/vocab";

// Date.parse("2026-02-30") is a number (it rolls over to March 2nd) but PostgreSQL refuses the
// day: check that the day exists by a round trip through the UTC calendar.
const isRealDay = (s: string) => {
  const [y, m, d] = s.split("-").map(Number) as [number, number, number];
  const t = new Date(Date.UTC(y, m - 1, d));
  return y >= 1 && t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
};

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2026-03-14.").refine(isRealDay, "Not a real date.");

export const createVisitSchema = z.object({
  visitDate: isoDate,
  patientPosition: z.enum(POSITIONS, { message: "Choose lithotomy, prone jack-knife or left lateral." }),
  indication: z.string().trim().max(2000, "Keep the indication under 2,000 characters.").optional(),
});
export type CreateVisitInput = z.infer<typeof createVisitSchema>;

export const preferencesSchema = z.object({
  displayConvention: z.enum(POSITIONS, { message: "Choose lithotomy, prone jack-knife or left lateral." }),
});
