// The invented demo scenario's accounts. Their password is published in the README, so a
// production server refuses to serve while any of them exists (lib/auth/servable.ts).
export const DEMO_PASSWORD = "Demo-pass-2026";

export const DEMO_ACCOUNT_EMAILS = [
  "clinician@dentate.example",
  "np.reyes@dentate.example",
  "reviewer@dentate.example",
  "nurse@dentate.example",
  "admin@dentate.example",
  "clinician@millbrook.example",
] as const;

/**
 * Why this server must not serve, or null. A production server (NODE_ENV=production) with demo
 * accounts in its database refuses, unless DENTATE_DEMO=1 says the install is a demonstration.
 */
export function demoRefusal(env: { NODE_ENV?: string; DENTATE_DEMO?: string }, demoAccounts: number): string | null {
  if (env.NODE_ENV !== "production" || demoAccounts === 0 || env.DENTATE_DEMO === "1") return null;
  return (
    `This database holds ${demoAccounts} demo account${demoAccounts === 1 ? "" : "s"} whose password is published. ` +
    "A production server will not serve it. Start from an empty database (DENTATE_DEMO=0 bash scripts/start.sh) " +
    "and create the first administrator with npm run admin:create, or set DENTATE_DEMO=1 for a demonstration install."
  );
}
