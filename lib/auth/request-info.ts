// Where a request came from and whether it arrived over https. Forwarding headers
// (X-Forwarded-For/-Proto/-Host) are believed only as far as DENTATE_TRUSTED_PROXY_HOPS says: a
// client can send any of them, and Next's own server keeps a client's X-Forwarded-For instead of
// adding the socket's address to it. The socket's address and scheme come from PEER_HEADER, which
// scripts/peer-address.cjs (preloaded into the server process) writes on every request, replacing
// whatever a client sent under that name.

type Env = Readonly<Record<string, string | undefined>>;

export const PEER_HEADER = "x-dentate-peer";
export const PEER_PROTO_HEADER = "x-dentate-peer-proto";

/** How many proxies in front of the app are trusted to append to the forwarding headers (0–10). */
export function trustedProxyHops(env: Env = process.env): number {
  const raw = env.DENTATE_TRUSTED_PROXY_HOPS?.trim();
  if (!raw) return 0;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0 || n > 10) throw new Error(`DENTATE_TRUSTED_PROXY_HOPS must be a whole number from 0 to 10, not "${raw}".`);
  return n;
}

function list(value: string | null): string[] {
  return (value ?? "").split(",").map((s) => s.trim()).filter(Boolean);
}

/**
 * The client's address: the socket's peer when no proxy is trusted; otherwise, in the chain of
 * X-Forwarded-For entries followed by the peer, the entry `hops` places from the right (each
 * trusted proxy appends the address it saw). Entries further left were written by the client.
 */
export function clientIp(headers: Headers, env: Env = process.env): string {
  const hops = trustedProxyHops(env);
  const peer = headers.get(PEER_HEADER)?.trim() || "unknown";
  if (hops === 0) return peer;
  const chain = [...list(headers.get("x-forwarded-for")), peer];
  return chain[Math.max(0, chain.length - 1 - hops)]!;
}

/** The value written by the outermost trusted proxy, or null when no proxy is trusted. */
function forwarded(headers: Headers, name: string, hops: number): string | null {
  if (hops === 0) return null;
  const values = list(headers.get(name));
  if (values.length === 0) return null;
  return values[Math.max(0, values.length - hops)]!;
}

/** The scheme the request arrived with at the outermost trusted hop. */
export function requestScheme(headers: Headers, env: Env = process.env): "https" | "http" {
  const proto = forwarded(headers, "x-forwarded-proto", trustedProxyHops(env)) ?? headers.get(PEER_PROTO_HEADER);
  return proto?.trim().toLowerCase() === "https" ? "https" : "http";
}

/** The host the client addressed. */
export function requestHost(headers: Headers, env: Env = process.env): string | null {
  return forwarded(headers, "x-forwarded-host", trustedProxyHops(env)) ?? headers.get("host");
}

/** The configured public address is https. */
export function publicAddressIsHttps(env: Env = process.env): boolean {
  return (env.APP_BASE_URL ?? "").trim().toLowerCase().startsWith("https:");
}

/**
 * Whether cookies must be marked Secure: whenever the public address is https (TLS may end at
 * the app or at a proxy that does not say so), or the request itself arrived over https.
 */
export function isHttps(headers: Headers, env: Env = process.env): boolean {
  return publicAddressIsHttps(env) || requestScheme(headers, env) === "https";
}

export function readCookie(headers: Headers, name: string): string | null {
  const raw = headers.get("cookie");
  if (!raw) return null;
  for (const part of raw.split(";")) {
    const [k, ...v] = part.trim().split("=");
    if (k === name) return v.join("=") || null;
  }
  return null;
}

/** A mutation must come from our own origin (CSRF defence in depth beside SameSite=Lax). */
export function originAllowed(headers: Headers, env: Env = process.env): boolean {
  const origin = headers.get("origin");
  if (!origin) return false;
  let originUrl: URL;
  try {
    originUrl = new URL(origin);
  } catch {
    return false;
  }
  // Same host, and the same scheme as the request arrived with: a page served over plain http
  // on our host name is not our https origin.
  const host = requestHost(headers, env);
  const sameScheme = originUrl.protocol === `${requestScheme(headers, env)}:`;
  if (host && originUrl.host === host && sameScheme) return true;
  // The configured public address is ours whatever the proxies in front say.
  if (env.APP_BASE_URL && safeOrigin(env.APP_BASE_URL) === originUrl.origin) return true;
  const extra = (env.DENTATE_ALLOWED_ORIGINS ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  return extra.includes(origin);
}

function safeOrigin(url: string): string | null {
  try {
    return new URL(url.trim()).origin;
  } catch {
    return null;
  }
}
