import { z } from "zod";
import { text } from "@/lib/validation/text";
import { HIV_STATUS, PATIENT_STATUSES, RISK_GROUPS, SEX_AT_BIRTH } from "@/lib/domain/vocab";

// One patient's fields, shared by the registration form, the edit form, their routes and the importer.

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** A real calendar day written YYYY-MM-DD (2023-02-29 is refused). */
export function isCalendarDate(s: string): boolean {
  if (!ISO_DATE.test(s)) return false;
  const d = new Date(`${s}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
}

const todayIso = () => new Date().toISOString().slice(0, 10);

// A leading = + @ or a control character is never part of a name and could act as a formula
// when the name is later opened in a spreadsheet.
const nameText = (what: string) =>
  text({ message: `Give the ${what}.` })
    .trim()
    .min(1, `Give the ${what}.`)
    .max(100, `Keep the ${what} under 100 characters.`)
    .refine((s) => !/^[=+@]/.test(s) && !/[\u0000-\u001f\u007f]/.test(s), `The ${what} has characters a name cannot have.`);

const dateOfBirth = text({ message: "Give the date of birth." })
  .trim()
  .min(1, "Give the date of birth.")
  .refine(isCalendarDate, "Write the date of birth as a real date, YYYY-MM-DD.")
  .refine((s) => s >= "1900-01-01", "A date of birth before 1900 is not plausible.")
  .refine((s) => s <= todayIso(), "The date of birth is in the future.");

const optionalDate = text()
  .trim()
  .refine((s) => s === "" || isCalendarDate(s), "Write the date as a real date, YYYY-MM-DD.")
  .transform((s) => (s === "" ? null : s))
  .nullable()
  .optional();

const mrn = text({ message: "Give the medical record number." })
  .trim()
  .min(1, "Give the medical record number.")
  .max(40, "A record number is at most 40 characters.")
  .regex(/^[A-Za-z0-9][A-Za-z0-9 ./_-]*$/, "A record number is letters and digits (with . / _ - or spaces between).");

const emptyToNull = (s: string) => (s === "" ? null : s);

const postalCode = text()
  .trim()
  .toUpperCase()
  .refine((s) => s === "" || /^[A-Z0-9][A-Z0-9 -]{1,8}[A-Z0-9]$/.test(s), "Give a postal code such as 60614 or SW1A 1AA.")
  .transform(emptyToNull)
  .nullable()
  .optional();

const contactEmail = text()
  .trim()
  .max(254, "An e-mail address is at most 254 characters.")
  .refine((s) => s === "" || z.email().safeParse(s).success, "Give an e-mail address such as name@example.org, or leave it empty.")
  .transform(emptyToNull)
  .nullable()
  .optional();

/** Risk groups as a set: duplicates dropped, in vocabulary order. Several may apply at once. */
const riskGroups = z
  .array(z.enum(RISK_GROUPS, { message: "Not a risk group." }), { message: "Choose the risk groups that apply." })
  .max(RISK_GROUPS.length, "Too many risk groups.")
  .transform((gs) => RISK_GROUPS.filter((g) => gs.includes(g)));

const clinicianId = text()
  .trim()
  .max(64, "Not a clinician.")
  .transform(emptyToNull)
  .nullable()
  .optional();

/** The fields of one patient, as a person types them (the importer parses each row with this). */
export const patientFieldsSchema = z.object({
  familyName: nameText("family name"),
  givenName: nameText("given name"),
  dateOfBirth,
  sexAtBirth: z.enum(SEX_AT_BIRTH, { message: "Choose the sex at birth." }),
  mrn,
  postalCode,
  hivStatus: z.enum(HIV_STATUS, { message: "Choose the HIV status." }),
  riskGroups,
  /** Date of transplant or of the vulvar HSIL or cancer diagnosis, where a chosen group needs one. */
  riskDate: optionalDate,
  contactEmail,
  clinicianId,
});
export type PatientFields = z.output<typeof patientFieldsSchema>;
export type PatientFieldsInput = z.input<typeof patientFieldsSchema>;

const HIV_GROUPS: readonly string[] = ["msm_tw_hiv", "other_hiv"];

/** A group "living with HIV" with a recorded HIV status other than positive is a slip of the hand. */
export function hivGroupsAgree(f: { hivStatus?: string; riskGroups?: readonly string[] }): boolean {
  return !(f.riskGroups ?? []).some((g) => HIV_GROUPS.includes(g)) || f.hivStatus === "positive";
}
const HIV_DISAGREES = { message: "A group living with HIV is ticked: set the HIV status to living with HIV, or untick the group.", path: ["riskGroups"] };

/** Registration: the fields, the site, and the user's confirmation after a possible-duplicate warning. */
export const registerPatientSchema = patientFieldsSchema
  .extend({
    siteId: text({ message: "Choose the site." }).uuid("Choose the site."),
    confirmDuplicate: z.boolean().optional(),
  })
  .refine(hivGroupsAgree, HIV_DISAGREES);
export type RegisterPatientInput = z.output<typeof registerPatientSchema>;

/** An edit: any of the fields, the follow-up status, and the version the form was read at. */
export const updatePatientSchema = patientFieldsSchema.partial().extend({
  status: z.enum(PATIENT_STATUSES, { message: "Choose active, inactive or deceased." }).optional(),
  version: z.number({ message: "The form is out of date: reload it." }).int().min(1).max(2_147_483_647),
});
export type UpdatePatientInput = z.output<typeof updatePatientSchema>;

/** The patient list's sort columns. */
export const PATIENT_SORTS = ["name", "mrn", "lastVisit", "nextDue", "grade", "disagreements"] as const;
export type PatientSort = (typeof PATIENT_SORTS)[number];
