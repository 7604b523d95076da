"use server";

import { revalidatePath } from "next/cache";
import { setNextDueOverride } from "@/lib/server/due-dates";
import { getCurrentUser, requireRole, scopeOf } from "@/lib/auth/guard";
import { clientIp } from "@/lib/auth/request-info";
import { assertActionOrigin } from "@/lib/auth/action-origin";
import { AppError } from "@/lib/errors";
import { fieldErrors } from "@/lib/http/route";
import { overrideDueSchema, type OverrideState } from "@/lib/validation/due-dates";

/** The clinician's own next-visit date, or back to the rules. Audited with before and after. */
export async function overrideDueAction(_prev: OverrideState, form: FormData): Promise<OverrideState> {
  try {
    const h = await assertActionOrigin();
    const user = requireRole(await getCurrentUser(), ["clinician", "admin"]);
    const parsed = overrideDueSchema.safeParse(Object.fromEntries(form.entries()));
    if (!parsed.success) return { fields: fieldErrors(parsed.error) };
    const v = parsed.data;
    await setNextDueOverride({
      scope: scopeOf(user), patientId: v.patientId, by: user.id, ip: clientIp(h),
      date: v.mode === "set" ? v.date : null, reason: v.mode === "set" ? v.reason : null,
    });
    revalidatePath(`/patients/${v.patientId}`);
    return { ok: true };
  } catch (err) {
    if (err instanceof AppError) return { message: err.message };
    throw err;
  }
}
