// PUBLIC: no session. The answer is the same whether or not the address has an account: same
// status, same body, and at least the same time (minDurationMs covers the extra work).
import { requestPasswordReset } from "@/lib/server/accounts";
import { hitRateLimit } from "@/lib/server/rate-limit";
import { forgotPasswordSchema } from "@/lib/accounts/schemas";
import { publicRoute } from "@/lib/http/public-route";
import { readJson } from "@/lib/http/route";

const RESET_REQUEST_ANSWER = { ok: true, message: "If this address belongs to an account, a reset link is on its way. It works once, for one hour." };

export const POST = publicRoute({ limiter: "forgot-password", perAddress: 20, windowSeconds: 15 * 60, minDurationMs: 600 }, async ({ req, ip }) => {
  const { email } = await readJson(req, forgotPasswordSchema);
  // Per address too, so nobody can flood one mailbox; over the limit the answer does not change.
  if ((await hitRateLimit(`forgot-password:account:${email}`, 60 * 60)) <= 5) {
    await requestPasswordReset({ email, ip });
  }
  return RESET_REQUEST_ANSWER;
});
