// PUBLIC: no session. Sets the password of an invited account once.
import { acceptInvitation } from "@/lib/server/accounts";
import { acceptInviteSchema } from "@/lib/accounts/schemas";
import { publicRoute } from "@/lib/http/public-route";
import { readJson } from "@/lib/http/route";

export const POST = publicRoute({ limiter: "accept-invite", perAddress: 20, windowSeconds: 15 * 60 }, async ({ req, ip }) => {
  const body = await readJson(req, acceptInviteSchema);
  const { email } = await acceptInvitation({ ...body, ip });
  return { ok: true, email };
});
