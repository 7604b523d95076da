import "server-only";
import { countAccountsByEmail } from "@/db/queries/users";
import { DEMO_ACCOUNT_EMAILS, demoRefusal } from "@/lib/domain/demo-accounts";
import { AppError } from "@/lib/errors";

// The demo accounts are counted once per process (the first request that needs it): a refusing
// server keeps refusing until it is restarted against a database without them.
let demoAccounts: Promise<number> | null = null;

export async function servableRefusal(env: NodeJS.ProcessEnv = process.env): Promise<string | null> {
  if (env.NODE_ENV !== "production" || env.DENTATE_DEMO === "1") return null;
  demoAccounts ??= countAccountsByEmail(DEMO_ACCOUNT_EMAILS).catch((err) => {
    demoAccounts = null;
    throw err;
  });
  return demoRefusal(env, await demoAccounts);
}

/** Every session check, sign-in and public route passes here: 503 with the reason when refused. */
export async function assertServable(): Promise<void> {
  const refusal = await servableRefusal();
  if (refusal) throw new AppError("unavailable", refusal);
}
