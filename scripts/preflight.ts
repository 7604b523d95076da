// Run before `next start` (scripts/start.sh, npm run serve): a production server whose database
// holds demo accounts says why and stops, once, instead of starting (lib/domain/demo-accounts.ts).
import { runScript } from "@/db/client";
import { servableRefusal } from "@/lib/auth/servable";

runScript(async () => {
  const refusal = await servableRefusal({ ...process.env, NODE_ENV: "production" });
  if (refusal) {
    console.error(`[dentate] ${refusal}`);
    process.exitCode = 1;
  }
});
