"use server";

import { headers } from "next/headers";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { setNextDueOverride } from "@/db/queries/due-dates";
import { getCurrentUser, requireRole, scopeOf } from "@/lib/auth/guard";
import { clientIp } from "@/lib/auth/request-info";
import { AppError } from "@/lib/errors";
import { fieldErrors } from "@/lib/http/route";

export interface OverrideState {
  ok?: boolean;
  message?: string;
  fields?: Record<string, string[]>;
}

const overrideSchema = z.discriminatedUnion("mode", [
  z.object({
    mode: z.literal("set"),
    patientId: z.string().uuid(),
    date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Choose a date.").refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)), "Choose a real date."),
    reason: z.string().trim().min(3, "Say why this date (the audit trail keeps it).").max(500, "Keep the reason under 500 characters."),
  }),
  z.object({ mode: z.literal("clear"), patientId: z.string().uuid() }),
]);

/** The clinician's own next-visit date, or back to the rules. Audited with before and after. */
export async function overrideDueAction(_prev: OverrideState, form: FormData): Promise<OverrideState> {
  try {
    const user = requireRole(await getCurrentUser(), ["clinician", "admin"]);
    const parsed = overrideSchema.safeParse(Object.fromEntries(form.entries()));
    if (!parsed.success) return { fields: fieldErrors(parsed.error) };
    const v = parsed.data;
    await setNextDueOverride({
      scope: scopeOf(user), patientId: v.patientId, by: user.id, ip: clientIp(await headers()),
      date: v.mode === "set" ? v.date : null, reason: v.mode === "set" ? v.reason : null,
    });
    revalidatePath(`/patients/${v.patientId}`);
    return { ok: true };
  } catch (err) {
    if (err instanceof AppError) return { message: err.message };
    throw err;
  }
}
