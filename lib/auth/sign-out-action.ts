"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/auth/guard";
import { blankSessionCookie, invalidateSession } from "@/lib/auth/session";
import { clientIp, isHttps } from "@/lib/auth/request-info";
import { recordAudit } from "@/lib/server/audit";
import { assertActionOrigin } from "./action-origin";

export async function signOutAction(): Promise<void> {
  const h = await assertActionOrigin();
  const user = await getCurrentUser();
  if (user) {
    await invalidateSession(user.sessionId);
    await recordAudit({ userId: user.id, action: "sign_out", ip: clientIp(h) });
  }
  const c = blankSessionCookie(isHttps(h));
  (await cookies()).set(c.name, c.value, c.attributes);
  redirect("/sign-in");
}
