import { listAwaitingResults } from "@/db/queries/biopsies";
import { scopeOf } from "@/lib/auth/guard";
import { route } from "@/lib/http/route";
import { recordAudit } from "@/lib/server/audit";

export const GET = route({ roles: ["clinician", "admin"] }, async ({ user, ip }) => {
  const biopsies = await listAwaitingResults(scopeOf(user));
  await recordAudit({ userId: user.id, ip, action: "biopsy.worklist.read", detail: { count: biopsies.length } });
  return { biopsies };
});
