// The first administrator of an empty install (README, "A real install"):
//   npm run admin:create -- --email lead@clinic.example --site "Riverside Anal Health Clinic" [--site-code RAH]
// Creates the site if it is new, queues the invitation mail (the mail worker delivers it) and prints
// the one-time link. Refuses once an active administrator exists.
import { parseArgs } from "node:util";
import { runScript } from "@/db/client";
import { AppError } from "@/lib/errors";
import { inviteFirstAdministrator } from "@/lib/server/first-admin";
import { firstAdminSchema } from "@/lib/validation/first-admin";

export async function main(argv: string[]): Promise<number> {
  const { values } = parseArgs({ args: argv, options: { email: { type: "string" }, site: { type: "string" }, "site-code": { type: "string" } } });
  const parsed = firstAdminSchema.safeParse({ email: values.email, site: values.site, siteCode: values["site-code"] });
  if (!parsed.success) {
    for (const issue of parsed.error.issues) console.error(`--${issue.path.join(".") === "siteCode" ? "site-code" : issue.path.join(".")}: ${issue.message}`);
    console.error('Usage: npm run admin:create -- --email ADDRESS --site "SITE NAME" [--site-code CODE]');
    return 2;
  }
  try {
    const r = await inviteFirstAdministrator(parsed.data);
    console.log(`Site ${r.siteCode} ${r.siteCreated ? "created" : "already there"}.${r.revokedEarlier ? ` ${r.revokedEarlier} earlier set-up link(s) revoked.` : ""}`);
    console.log(`Invitation for ${parsed.data.email} queued for e-mail. The one-time link (valid until ${r.expiresAt.toISOString()}):`);
    console.log(r.link);
    return 0;
  } catch (err) {
    if (err instanceof AppError) {
      console.error(err.message);
      return 3;
    }
    throw err;
  }
}

if (process.argv[1] && /admin-create\.ts$/.test(process.argv[1])) {
  runScript(async () => {
    process.exitCode = await main(process.argv.slice(2));
  });
}
