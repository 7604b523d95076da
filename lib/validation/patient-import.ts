import { z } from "zod";
import { text } from "./text";
import { IMPORT_FIELD_KEYS } from "@/lib/patient-import/fields";
import { MAX_COLUMNS } from "@/lib/patient-import/limits";

const column = z.number({ message: "Choose a column." }).int("Choose a column.").min(0, "Choose a column.").max(MAX_COLUMNS - 1, "Choose a column.").nullable();

/** A column for every importable field (null: not imported). */
export const columnMappingSchema = z.strictObject(
  Object.fromEntries(IMPORT_FIELD_KEYS.map((k) => [k, column])) as Record<(typeof IMPORT_FIELD_KEYS)[number], typeof column>,
);

export const importCheckSchema = z.strictObject({
  siteId: z.uuid("Choose a site."),
  format: z.enum(["csv", "fhir"], { message: "Choose CSV or FHIR." }),
  fileName: text().max(255, "The file name is too long.").regex(/^[^\u0000-\u001f\u007f]*$/, "The file name holds control characters.").optional(),
  /** The file's text; its size is checked against the import limit separately. */
  content: z.string({ message: "Choose a file." }).min(1, "The file is empty."),
  /** Without it, the columns are matched by their header names. */
  mapping: columnMappingSchema.optional(),
});
export type ImportCheckInput = z.infer<typeof importCheckSchema>;

export const importRunSchema = importCheckSchema.extend({
  /** The user's explicit choice to import the good rows of a file that also has bad ones. */
  acceptValidRows: z.boolean({ message: "Must be true or false." }).optional(),
});
export type ImportRunInput = z.infer<typeof importRunSchema>;
