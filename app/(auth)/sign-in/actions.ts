"use server";

import { cookies } from "next/headers";
import { redirect } from "next/navigation";
import { signIn } from "@/lib/auth/sign-in";
import { clientIp, isHttps } from "@/lib/auth/request-info";
import { assertActionOrigin } from "@/lib/auth/action-origin";
import { sessionCookie } from "@/lib/auth/session";
import { AppError, isDatabaseDown } from "@/lib/errors";
import { signInSchema } from "@/lib/validation/auth";
import { fieldErrors } from "@/lib/http/route";
import { homeFor } from "@/components/shell/nav-links";

export interface SignInState {
  message?: string;
  fields?: Record<string, string[]>;
  email?: string;
}

export async function signInAction(_prev: SignInState, form: FormData): Promise<SignInState> {
  const email = String(form.get("email") ?? "");
  let h: Headers;
  try {
    h = await assertActionOrigin();
  } catch (err) {
    if (err instanceof AppError) return { message: err.message, email };
    throw err;
  }
  const parsed = signInSchema.safeParse({ email: form.get("email"), password: form.get("password") });
  if (!parsed.success) return { fields: fieldErrors(parsed.error), email };
  let home: string;
  try {
    const { sessionId, role } = await signIn(parsed.data.email, parsed.data.password, clientIp(h));
    const c = sessionCookie(sessionId, isHttps(h));
    (await cookies()).set(c.name, c.value, c.attributes);
    home = homeFor(role);
  } catch (err) {
    if (err instanceof AppError) return { message: err.message, email };
    if (isDatabaseDown(err)) return { message: "The service is briefly unavailable. Try again in a moment.", email };
    throw err;
  }
  redirect(home);
}
