import { z } from "zod";
import { isoDateSchema } from "./dates";
import { text } from "./text";

// The audit trail's filter form. Its dates go through the shared date schema, so an impossible
// day (2024-13-45) is answered with the form's message instead of reaching the database.

export const auditFilterSchema = z
  .object({
    user: text().max(100).optional(),
    action: text().max(100).optional(),
    // An MRN as staff know it, or (from older links) the internal id.
    patient: text().trim().max(100, "Too long for an MRN.").optional(),
    from: isoDateSchema().optional(),
    to: isoDateSchema().optional(),
  })
  .refine((f) => !f.from || !f.to || f.from <= f.to, { message: "The end date cannot come before the start date.", path: ["to"] });
export type AuditFilterInput = z.infer<typeof auditFilterSchema>;

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v) || undefined;

/**
 * Reads the filter from a query string: the fields that pass, and a message per field that does
 * not (that field is left out of the filter, so the page still answers).
 */
export function readAuditFilter(raw: Record<string, string | string[] | undefined>): { filter: AuditFilterInput; errors: Record<string, string> } {
  const values = { user: first(raw.user), action: first(raw.action), patient: first(raw.patient), from: first(raw.from), to: first(raw.to) };
  const r = auditFilterSchema.safeParse(values);
  if (r.success) return { filter: r.data, errors: {} };
  const errors: Record<string, string> = {};
  for (const issue of r.error.issues) errors[String(issue.path[0] ?? "_")] ??= issue.message;
  const kept = Object.fromEntries(Object.entries(values).filter(([k]) => !(k in errors)));
  return { filter: auditFilterSchema.safeParse(kept).data ?? {}, errors };
}
