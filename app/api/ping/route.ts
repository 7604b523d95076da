// The benchmark floor: the cheapest answer this server can give (constant JSON, no session, no
// database), so `npm run bench` can measure every real route as a ratio to it in the same run.
// Deliberately not wrapped in publicRoute(): its per-address rate limit is a database write, which
// would make the floor something other than the framework alone. It reveals nothing and changes
// nothing, so it is listed as public in the access matrix through the same marker.
// It carries the security headers every API answer carries, so the floor includes their cost.
import { isHttps } from "@/lib/auth/request-info";
import { withApiHeaders } from "@/lib/http/security-headers";

export const dynamic = "force-dynamic";

export function GET(req: Request): Response {
  return withApiHeaders(Response.json({ ok: true }, { headers: { "cache-control": "no-store" } }), { https: isHttps(req.headers) });
}
(GET as unknown as { dentateRoles: "public" }).dentateRoles = "public";
