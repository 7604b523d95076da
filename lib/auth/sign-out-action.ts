"use server";

import { cookies, headers } from "next/headers";
import { redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/auth/guard";
import { blankSessionCookie, invalidateSession } from "@/lib/auth/session";
import { clientIp, isHttps } from "@/lib/auth/request-info";
import { recordAudit } from "@/lib/server/audit";

export async function signOutAction(): Promise<void> {
  const user = await getCurrentUser();
  const h = await headers();
  if (user) {
    await invalidateSession(user.sessionId);
    await recordAudit({ userId: user.id, action: "sign_out", ip: clientIp(h) });
  }
  const c = blankSessionCookie(isHttps(h));
  (await cookies()).set(c.name, c.value, c.attributes);
  redirect("/sign-in");
}
