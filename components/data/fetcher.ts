// The one way the client talks to Dentate's JSON API. Error bodies
// ({ error: { code, message, fields? } }) become a thrown ApiError, so SWR and every
// mutation see the same shape.

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields?: Record<string, string[]>;
  /** The whole error object, for answers that carry more (e.g. the candidates of a duplicate warning). */
  readonly detail?: Record<string, unknown>;
  constructor(status: number, code: string, message: string, fields?: Record<string, string[]>, detail?: Record<string, unknown>) {
    super(message);
    this.detail = detail;
    this.name = "ApiError";
    this.status = status;
    this.code = code;
    this.fields = fields;
  }
}

async function toApiError(res: Response): Promise<ApiError> {
  let body: unknown = null;
  try {
    body = await res.json();
  } catch {
    // Not JSON (a proxy page, an empty 502): fall through to a generic message.
  }
  const err = (body as { error?: { code?: unknown; message?: unknown; fields?: unknown } } | null)?.error;
  const code = typeof err?.code === "string" ? err.code : res.status === 0 ? "network" : `http_${res.status}`;
  const message = typeof err?.message === "string" ? err.message : `The server answered ${res.status}.`;
  const fields = err?.fields && typeof err.fields === "object" ? (err.fields as Record<string, string[]>) : undefined;
  return new ApiError(res.status, code, message, fields, err && typeof err === "object" ? (err as Record<string, unknown>) : undefined);
}

async function call<T>(url: string, init?: RequestInit): Promise<T> {
  let res: Response;
  try {
    res = await fetch(url, { credentials: "same-origin", ...init, headers: { accept: "application/json", ...init?.headers } });
  } catch {
    throw new ApiError(0, "network", "The server could not be reached. Check the connection.");
  }
  if (!res.ok) throw await toApiError(res);
  if (res.status === 204) return undefined as T;
  return (await res.json()) as T;
}

/** SWR fetcher: GET a JSON resource. */
export function fetcher<T>(url: string): Promise<T> {
  return call<T>(url);
}

/** A JSON mutation. The browser adds Origin to same-origin POST/PATCH/DELETE itself. */
export function sendJson<T>(method: "POST" | "PATCH" | "PUT" | "DELETE", url: string, body?: unknown): Promise<T> {
  return call<T>(url, {
    method,
    headers: body === undefined ? {} : { "content-type": "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
}
