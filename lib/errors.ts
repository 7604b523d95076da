// One error type for the whole server; one function maps it to an HTTP answer.

export type AppErrorCode =
  | "unauthenticated"
  | "forbidden"
  | "not_found"
  | "invalid"
  | "conflict"
  | "locked"
  | "too_large"
  | "unsupported_media"
  | "rate_limited"
  | "unavailable";

const STATUS: Record<AppErrorCode, number> = {
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  invalid: 400,
  conflict: 409,
  locked: 423,
  too_large: 413,
  unsupported_media: 415,
  rate_limited: 429,
  unavailable: 503,
};

const DEFAULT_MESSAGE: Record<AppErrorCode, string> = {
  unauthenticated: "Sign in to continue.",
  forbidden: "Your role does not allow this.",
  not_found: "Not found.",
  invalid: "Some fields need attention.",
  conflict: "Someone else changed this record. Reload to see the latest version.",
  locked: "This visit is signed and can no longer be edited. Add an addendum instead.",
  too_large: "The file is too large.",
  unsupported_media: "This kind of file is not accepted.",
  rate_limited: "Too many attempts. Wait a few minutes and try again.",
  unavailable: "The service is briefly unavailable. Try again in a moment.",
};

export type FieldErrors = Record<string, string[]>;

export class AppError extends Error {
  readonly code: AppErrorCode;
  readonly fields?: FieldErrors;
  constructor(code: AppErrorCode, message?: string, fields?: FieldErrors) {
    super(message ?? DEFAULT_MESSAGE[code]);
    this.code = code;
    this.fields = fields;
  }
  get status(): number {
    return STATUS[this.code];
  }
}

export interface ErrorBody {
  error: { code: AppErrorCode | "internal"; message: string; fields?: FieldErrors };
}

// PostgreSQL unavailability: connection refused/reset, server shutting down, too many clients.
const DB_DOWN_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "CONNECT_TIMEOUT", "CONNECTION_CLOSED", "CONNECTION_ENDED", "CONNECTION_DESTROYED", "57P01", "57P02", "57P03", "53300", "08006", "08001", "08003"]);

// The driver's error is often wrapped (drizzle's query error keeps it as `cause`; a refused
// connection to a host with several addresses is an AggregateError), so look a few levels deep.
export function isDatabaseDown(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== "object" || depth > 4) return false;
  const e = err as { code?: unknown; syscall?: unknown; cause?: unknown; errors?: unknown };
  if (typeof e.code === "string" && DB_DOWN_CODES.has(e.code)) return true;
  // Through a Unix socket (DATABASE_SOCKET_DIR), a stopped server has removed its socket file.
  if (e.code === "ENOENT" && e.syscall === "connect") return true;
  if (Array.isArray(e.errors) && e.errors.some((inner) => isDatabaseDown(inner, depth + 1))) return true;
  return isDatabaseDown(e.cause, depth + 1);
}

// PostgreSQL class 22 "data exception" (SQLSTATE, PostgreSQL manual appendix A): the value
// itself cannot be stored, e.g. 22021 a NUL character in text, 22008 February 30th, 22003 a
// number out of range. The client sent it, so it is a 400, and the statement wrote nothing.
// A safety net behind the zod schemas, which should refuse such values first.
export function isRefusedData(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== "object" || depth > 4) return false;
  const e = err as { code?: unknown; cause?: unknown; severity?: unknown };
  if (typeof e.code === "string" && e.code.startsWith("22") && e.code.length === 5 && typeof e.severity === "string") return true;
  return isRefusedData(e.cause, depth + 1);
}

export function errorToBody(err: unknown): { status: number; body: ErrorBody } {
  if (err instanceof AppError) {
    return { status: err.status, body: { error: { code: err.code, message: err.message, fields: err.fields } } };
  }
  if (isDatabaseDown(err)) {
    const e = new AppError("unavailable");
    return { status: e.status, body: { error: { code: e.code, message: e.message } } };
  }
  if (isRefusedData(err)) {
    const e = new AppError("invalid", "Some of the values sent cannot be stored (for example a date that does not exist or a hidden control character).", { _: ["A value cannot be stored."] });
    return { status: e.status, body: { error: { code: e.code, message: e.message, fields: e.fields } } };
  }
  console.error("[dentate] unexpected error", err);
  return { status: 500, body: { error: { code: "internal", message: "Something went wrong. The team has been told." } } };
}
