import { z } from "zod";
import { text } from "@/lib/validation/text";
import { ACETOWHITE, GRADES, LUGOL, MORPHOLOGY, VESSELS, type Position } from "@/lib/domain/vocab";
import { clockEndH, clockStartH, endOf12IsWholeCircle, FULL_CIRCLE_ONLY_MESSAGE } from "@/lib/validation/clock";

// One schema for the lesion form and the lesions route. Clock hours are stored in the
// lithotomy convention, [0, 12), the whole circumference 0 → 12 (lib/validation/clock.ts);
// distance in cm from the verge, negative = perianal skin.
const distanceCm = z.number({ message: "Distance must be a number of cm." }).min(-5, "Perianal skin reaches 5 cm outside the verge.").max(15, "Distances beyond 15 cm from the verge are outside the map.");

export const lesionFieldsSchema = z.object({
  clockStartH,
  clockEndH,
  distanceStartCm: distanceCm,
  distanceEndCm: distanceCm,
  grade: z.enum(GRADES, { message: "Choose an impression grade." }),
  morphology: z.enum(MORPHOLOGY, { message: "Choose a surface contour." }).nullable().optional(),
  acetowhite: z.enum(ACETOWHITE, { message: "Choose the acetowhite change." }).nullable().optional(),
  lugol: z.enum(LUGOL, { message: "Choose the Lugol's iodine uptake." }).nullable().optional(),
  vessels: z.array(z.enum(VESSELS, { message: "Unknown vessel pattern." })).max(3).optional(),
  sizeMm: z.number({ message: "Size must be a number of mm." }).positive("Size must be above 0 mm.").max(100, "Size above 100 mm is not plausible.").nullable().optional(),
  note: text().max(2000, "Keep the note under 2,000 characters.").nullable().optional(),
});

const ordered = (v: { distanceStartCm?: number; distanceEndCm?: number }) =>
  v.distanceStartCm === undefined || v.distanceEndCm === undefined || v.distanceStartCm <= v.distanceEndCm;
const orderedMessage = { message: "The distance range must run from the lower to the higher value.", path: ["distanceEndCm"] };
const wholeCircle = (v: { clockStartH?: number; clockEndH?: number }) => endOf12IsWholeCircle(v.clockStartH, v.clockEndH);
const wholeCircleMessage = { message: FULL_CIRCLE_ONLY_MESSAGE, path: ["clockEndH"] };

/** The lesion form's schema: the fields with the whole-circumference rule. */
export const lesionFormSchema = lesionFieldsSchema.refine(wholeCircle, wholeCircleMessage);

export const createLesionSchema = lesionFieldsSchema
  .extend({
    // Chosen by the client once per new lesion and sent again with every retry of that create:
    // a retry after an answer lost on the way finds the lesion already made (no second copy).
    clientKey: text().uuid("Not a valid client key.").optional(),
  })
  .refine(ordered, orderedMessage)
  .refine(wholeCircle, wholeCircleMessage);
export type CreateLesionInput = z.infer<typeof createLesionSchema>;

export const updateLesionSchema = lesionFieldsSchema
  .partial()
  .extend({
    version: z.number({ message: "The version you edited is required." }).int().positive(),
    trackId: text().uuid("Not a valid track.").nullable().optional(),
  })
  .refine(ordered, orderedMessage)
  // An update may send one end only: the service checks the pair as it will be stored.
  .refine((v) => v.clockStartH === undefined || wholeCircle(v), wholeCircleMessage);
export type UpdateLesionInput = z.infer<typeof updateLesionSchema>;

export const deleteLesionQuery = z.object({ version: z.coerce.number({ message: "The version is required." }).int().positive() });

/** What the lesions route returns for each lesion. */
export interface LesionDto {
  id: string;
  visitId: string;
  trackId: string | null;
  trackLabel: string | null;
  label: string;
  clockStartH: number;
  clockEndH: number;
  distanceStartCm: number;
  distanceEndCm: number;
  zone: string;
  grade: (typeof GRADES)[number];
  morphology: (typeof MORPHOLOGY)[number] | null;
  acetowhite: (typeof ACETOWHITE)[number] | null;
  lugol: (typeof LUGOL)[number] | null;
  vessels: (typeof VESSELS)[number][];
  sizeMm: number | null;
  note: string | null;
  version: number;
  /** Worst histology among the lesion's biopsies with a result, if any. */
  histology: "benign" | "lsil" | "hsil" | "scc" | null;
  biopsyLabels: string[];
  treated: boolean;
}

export interface VisitMapDto {
  visit: { id: string; patientId: string; visitDate: string; status: "draft" | "signed"; patientPosition: Position; readOnly: boolean };
  lesions: LesionDto[];
}
