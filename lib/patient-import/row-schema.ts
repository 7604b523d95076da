// The checks one imported patient passes: the registration form's rules.
import { z } from "zod";
import { isSafeText } from "@/lib/validation/text";
import { HIV_STATUS, RISK_GROUPS, SEX_AT_BIRTH } from "@/lib/domain/vocab";

const isRealDay = (s: string) => {
  const [y, m, d] = s.split("-").map(Number) as [number, number, number];
  const t = new Date(Date.UTC(y, m - 1, d));
  return y >= 1900 && t.getUTCFullYear() === y && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
};

// Control characters (a NUL cannot even be stored) have no place in a name, code or address.
const plain = (s: string) => !/[\u0000-\u001f\u007f]/.test(s) && isSafeText(s);
const CONTROL = "Holds a control character (an invisible code, such as a line break).";

export const importRowSchema = z.object({
  mrn: z.string({ message: "The MRN is missing." }).trim().min(1, "The MRN is missing.").max(40, "Keep the MRN under 40 characters.").refine(plain, CONTROL),
  familyName: z.string({ message: "The family name is missing." }).trim().min(1, "The family name is missing.").max(100, "Keep the family name under 100 characters.").refine(plain, CONTROL),
  givenName: z.string({ message: "The given name is missing." }).trim().min(1, "The given name is missing.").max(100, "Keep the given names under 100 characters.").refine(plain, CONTROL),
  dateOfBirth: z
    .string({ message: "The date of birth is missing." })
    .regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 1980-03-14 (year-month-day).")
    .refine(isRealDay, "Not a real date."),
  sexAtBirth: z.enum(SEX_AT_BIRTH, { message: "Sex at birth is missing." }),
  postalCode: z.string().trim().max(12, "Keep the postal code under 12 characters.").refine(plain, CONTROL).optional(),
  hivStatus: z.enum(HIV_STATUS).optional(),
  riskGroups: z.array(z.enum(RISK_GROUPS)).optional(),
  contactEmail: z.email("Not an e-mail address.").max(200, "Keep the e-mail under 200 characters.").optional(),
});
export type ImportRowValues = z.infer<typeof importRowSchema>;
