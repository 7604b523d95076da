import "server-only";
import { plainIssueMessage } from "@/lib/validation/plain-words";
import { z } from "zod";
import { userFromRequest, requireRole, type CurrentUser } from "@/lib/auth/guard";
import { clientIp, isHttps, originAllowed } from "@/lib/auth/request-info";
import { withApiHeaders } from "./security-headers";
import { AppError, errorToBody } from "@/lib/errors";
import type { Role } from "@/lib/domain/vocab";
import { recordAudit } from "@/lib/server/audit";

export interface RouteArgs<P> {
  req: Request;
  user: CurrentUser;
  params: P;
  ip: string;
}

export interface RouteOptions {
  /** Who may call it. Every route declares this; the access matrix test reads it. */
  roles: readonly Role[] | "any";
}

type Handler<P> = (args: RouteArgs<P>) => Promise<Response | object | null>;

const MUTATING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

export function json(body: unknown, status = 200, headers?: HeadersInit): Response {
  return Response.json(body, { status, headers: { "cache-control": "no-store", ...headers } });
}

/**
 * The one way to write a route handler: origin check on mutations, session, role,
 * then the handler; every failure becomes the same JSON error shape.
 */
export function route<P = Record<string, never>>(opts: RouteOptions, handler: Handler<P>) {
  const wrapped = async (req: Request, ctx?: { params?: Promise<P> }): Promise<Response> =>
    withApiHeaders(await answer(req, ctx), { https: isHttps(req.headers) });
  const answer = async (req: Request, ctx?: { params?: Promise<P> }): Promise<Response> => {
    let caller: CurrentUser | null = null;
    try {
      if (MUTATING.has(req.method) && !originAllowed(req.headers)) {
        throw new AppError("forbidden", "This request did not come from a Dentate page.");
      }
      caller = await userFromRequest(req);
      const user = requireRole(caller, opts.roles);
      const params = ((await ctx?.params) ?? {}) as P;
      const result = await handler({ req, user, params, ip: clientIp(req.headers) });
      if (result instanceof Response) return result;
      return json(result ?? { ok: true });
    } catch (err) {
      const { status, body } = errorToBody(err);
      if ((status === 403 || status === 404) && caller) await recordRefusal(req, caller, status);
      return json(body, status);
    }
  };
  (wrapped as unknown as { dentateRoles: RouteOptions["roles"] }).dentateRoles = opts.roles;
  return wrapped;
}

/** Addresses that hold patient data or exports: a refusal there is worth an audit row. */
const PATIENT_DATA_PATH = /^\/api\/(patients|visits|biopsies|lesions|attachments|reviews|adjudications|exports|studies\/[^/]+\/subjects)(\/|$)/;

/** A signed-in caller refused (403) or not shown (404) patient data or an export: who, what, from where. */
async function recordRefusal(req: Request, user: CurrentUser, status: number) {
  const path = new URL(req.url).pathname;
  if (!PATIENT_DATA_PATH.test(path)) return;
  try {
    await recordAudit({ userId: user.id, action: "access.refused", entityType: "route", ip: clientIp(req.headers), detail: { method: req.method, path, status } });
  } catch (e) {
    console.error("[dentate] could not record a refused request", e);
  }
}

export function fieldErrors(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join(".") : "_";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

export function parseWith<S extends z.ZodType>(schema: S, value: unknown): z.infer<S> {
  // Schemas' own messages win; anything else is said in plain words, never the library's.
  const r = schema.safeParse(value, { error: plainIssueMessage });
  if (!r.success) throw new AppError("invalid", undefined, fieldErrors(r.error));
  return r.data;
}

const MAX_JSON_BYTES = 256 * 1024;

/**
 * Reads a JSON body with a size limit and validates it; bad input is a 400 with field messages.
 * A route that takes a file inside its JSON (an import) passes its own limit and message.
 */
export async function readJson<S extends z.ZodType>(req: Request, schema: S, limit: { bytes: number; message: string } = { bytes: MAX_JSON_BYTES, message: "The request body is too large." }): Promise<z.infer<S>> {
  const declared = Number(req.headers.get("content-length") ?? 0);
  if (declared > limit.bytes) throw new AppError("too_large", limit.message);
  const text = await req.text();
  if (text.length > limit.bytes) throw new AppError("too_large", limit.message);
  let value: unknown;
  try {
    value = text.length ? JSON.parse(text) : undefined;
  } catch {
    throw new AppError("invalid", "The request body is not valid JSON.", { _: ["Not valid JSON."] });
  }
  return parseWith(schema, value);
}

export function readQuery<S extends z.ZodType>(req: Request, schema: S): z.infer<S> {
  const params = Object.fromEntries(new URL(req.url).searchParams.entries());
  return parseWith(schema, params);
}

export const uuidParam = z.string().uuid("Not a valid id.");

/** A malformed id names no record: answer as for a record that does not exist. */
export function idParam(value: unknown): string {
  const r = uuidParam.safeParse(value);
  if (!r.success) throw new AppError("not_found");
  return r.data;
}
