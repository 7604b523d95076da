import { z } from "zod";
import { text } from "@/lib/validation/text";
import { AIN_GRADES, HISTOLOGY, P16 } from "@/lib/domain/vocab";
import { lastFromAin } from "@/lib/codes/last";

/** A biopsy is taken from a mapped lesion, or from a clock position and distance. */
export const createBiopsySchema = z.union(
  [
    z.object({ lesionId: text().uuid("Not a valid lesion.") }).strict(),
    z
      .object({
        clockH: z.number({ message: "Clock position must be a number of hours." }).min(0).lt(12, "Clock hours run from 0 up to 12."),
        distanceCm: z.number({ message: "Distance must be a number of cm." }).min(-5, "Perianal skin reaches 5 cm outside the verge.").max(15),
      })
      .strict(),
  ],
  { message: "Give either a lesion, or a clock position and a distance." },
);
export type CreateBiopsyInput = z.infer<typeof createBiopsySchema>;

export const histologyResultSchema = z
  .object({
    histology: z.enum(HISTOLOGY, { message: "Choose benign, LSIL, HSIL or squamous cell carcinoma." }),
    ainGrade: z.enum(AIN_GRADES, { message: "Choose AIN1, AIN2 or AIN3." }).nullable().optional(),
    p16: z.enum(P16, { message: "Choose the p16 result." }).nullable().optional(),
  })
  // LAST (Darragh 2012): the AIN grade with p16 maps onto one tier; a report must agree with it.
  .refine((r) => !r.ainGrade || r.histology === lastFromAin(r.ainGrade, r.p16 ?? "not_done"), {
    message: "The AIN grade and p16 result map to a different LAST tier than the histology chosen.",
    path: ["ainGrade"],
  });
export type HistologyResultInput = z.infer<typeof histologyResultSchema>;
