// PUBLIC: no session. Completes a reset once and ends every session of the account.
import { completePasswordReset } from "@/lib/server/accounts";
import { resetPasswordSchema } from "@/lib/accounts/schemas";
import { invalidateUserSessions } from "@/lib/auth/session";
import { publicRoute } from "@/lib/http/public-route";
import { readJson } from "@/lib/http/route";

export const POST = publicRoute({ limiter: "reset-password", perAddress: 20, windowSeconds: 15 * 60 }, async ({ req, ip }) => {
  const body = await readJson(req, resetPasswordSchema);
  const { userId } = await completePasswordReset({ ...body, ip });
  await invalidateUserSessions(userId);
  return { ok: true };
});
