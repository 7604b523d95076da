import { z } from "zod";
import { text } from "@/lib/validation/text";
import { careDateSchema, careDateTimeSchema } from "./dates";
import { ADEQUACY, COMPLICATION_KINDS, CYTOLOGY, HPV_RESULTS, POSITIONS, SEVERITIES } from "@/lib/domain/vocab";

// One schema per form of the visit record, shared by the client forms and the routes.
// Unknown keys are stripped (zod's default), so a client can never smuggle in a computed field.

const isoDate = careDateSchema("Enter the visit date.");
const isoDateTime = careDateTimeSchema("Enter a time of day.");

const optionalText = (max: number, what: string) =>
  text().trim().max(max, `Keep the ${what} under ${max.toLocaleString("en")} characters.`).nullable().optional();

export const examDetailsFieldsSchema = z.object({
  visitDate: isoDate,
  patientPosition: z.enum(POSITIONS, { message: "Choose lithotomy, prone jack-knife or left lateral." }),
  indication: optionalText(2000, "indication"),
  cytology: z.enum(CYTOLOGY, { message: "Choose the prior anal cytology result." }),
  hpvResult: z.enum(HPV_RESULTS, { message: "Choose the HPV result." }),
  adequacy: z.enum(ADEQUACY, { message: "Say how much of the squamocolumnar junction was seen." }).nullable().optional(),
  examStartedAt: isoDateTime.nullable().optional(),
  examEndedAt: isoDateTime.nullable().optional(),
  anaesthesia: optionalText(500, "anaesthesia note"),
  patientWeightKg: z
    .number({ message: "Weight must be a number of kg." })
    .min(20, "Weight must be at least 20 kg.")
    .max(300, "Weight must be at most 300 kg.")
    .nullable()
    .optional(),
  plan: optionalText(4000, "plan"),
});

const endAfterStart = (v: { examStartedAt?: string | null; examEndedAt?: string | null }) =>
  !v.examStartedAt || !v.examEndedAt || Date.parse(v.examEndedAt) >= Date.parse(v.examStartedAt);
const endAfterStartMessage = { message: "The exam cannot end before it started.", path: ["examEndedAt"] };

/** PATCH of the exam details: the version the clinician edited guards against lost updates. */
export const examDetailsSchema = examDetailsFieldsSchema
  .extend({ version: z.number({ message: "The version you edited is required." }).int().positive() })
  .refine(endAfterStart, endAfterStartMessage);
export type ExamDetailsInput = z.infer<typeof examDetailsSchema>;

export const complicationSchema = z.object({
  kind: z.enum(COMPLICATION_KINDS, { message: "Choose pain, bleeding or other." }),
  severity: z.enum(SEVERITIES, { message: "Choose mild, moderate or severe." }),
  timing: z.enum(["during", "after"], { message: "Say whether it happened during or after the procedure." }),
  note: optionalText(1000, "note"),
});
export type ComplicationInput = z.infer<typeof complicationSchema>;

export const addendumSchema = z.object({
  body: text({ message: "Write the addendum." }).trim().min(1, "Write the addendum.").max(8000, "Keep the addendum under 8,000 characters."),
});
export type AddendumInput = z.infer<typeof addendumSchema>;

export const confirmDiagnosisSchema = z.object({
  code: text({ message: "Choose a suggested code." }).trim().regex(/^[A-Z]\d{2}(\.\d{1,4})?$/, "Not an ICD-10-CM code."),
});
export const diagnosisQuery = confirmDiagnosisSchema;

export interface VisitPermissions {
  canEdit: boolean;
  canSign: boolean;
  canAddAddendum: boolean;
}

/** What the record panels offer; the routes enforce the same rules on every write. */
export function visitPermissions(user: { id: string; role: string }, visit: { status: string; examinerId: string }): VisitPermissions {
  const draft = visit.status === "draft";
  return {
    canEdit: draft && user.role === "clinician",
    canSign: draft && (user.role === "admin" || (user.role === "clinician" && visit.examinerId === user.id)),
    canAddAddendum: !draft && (user.role === "clinician" || user.role === "admin"),
  };
}
