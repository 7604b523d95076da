import { listAwaitingResults } from "@/db/queries/biopsies";
import { scopeOf } from "@/lib/auth/guard";
import { route } from "@/lib/http/route";

export const GET = route({ roles: ["clinician", "admin"] }, async ({ user }) => ({ biopsies: await listAwaitingResults(scopeOf(user)) }));
