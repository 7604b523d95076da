import "server-only";
// The only routes that answer without a session (accept an invitation, ask for and complete a
// password reset). They still check the Origin of mutations and are rate-limited per client
// address; the access matrix lists them through the `dentateRoles = "public"` marker.
import { hitRateLimit } from "@/lib/server/rate-limit";
import { clientIp, isHttps, originAllowed } from "@/lib/auth/request-info";
import { assertServable } from "@/lib/auth/servable";
import { AppError, errorToBody } from "@/lib/errors";
import { json } from "./route";
import { withApiHeaders } from "./security-headers";

export interface PublicRouteOptions {
  /** A name for the limiter bucket, e.g. "forgot-password". */
  limiter: string;
  /** Requests allowed per client address in each window. */
  perAddress: number;
  windowSeconds: number;
  /** Every answer, success or failure, takes at least this long, so timing tells nothing. */
  minDurationMs?: number;
}

export interface PublicRouteArgs {
  req: Request;
  ip: string;
}

const MUTATING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

export function publicRoute(opts: PublicRouteOptions, handler: (args: PublicRouteArgs) => Promise<Response | object | null>) {
  const wrapped = async (req: Request): Promise<Response> => {
    const started = Date.now();
    let response: Response;
    try {
      if (MUTATING.has(req.method) && !originAllowed(req.headers)) {
        throw new AppError("forbidden", "This request did not come from a Dentate page.");
      }
      await assertServable();
      const ip = clientIp(req.headers);
      const hits = await hitRateLimit(`${opts.limiter}:ip:${ip}`, opts.windowSeconds);
      if (hits > opts.perAddress) throw new AppError("rate_limited");
      const result = await handler({ req, ip });
      response = result instanceof Response ? result : json(result ?? { ok: true });
    } catch (err) {
      const { status, body } = errorToBody(err);
      response = json(body, status);
    }
    const wait = (opts.minDurationMs ?? 0) - (Date.now() - started);
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    return withApiHeaders(response, { https: isHttps(req.headers) });
  };
  (wrapped as unknown as { dentateRoles: "public" }).dentateRoles = "public";
  return wrapped;
}
