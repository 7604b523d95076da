// Where a request came from and whether it arrived over https, from headers only.

export function clientIp(headers: Headers): string {
  const fwd = headers.get("x-forwarded-for");
  if (fwd) return fwd.split(",")[0]!.trim();
  return headers.get("x-real-ip") ?? "unknown";
}

export function isHttps(headers: Headers, url?: string): boolean {
  const proto = headers.get("x-forwarded-proto");
  if (proto) return proto.split(",")[0]!.trim() === "https";
  return url ? url.startsWith("https:") : false;
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
export function originAllowed(headers: Headers): boolean {
  const origin = headers.get("origin");
  if (!origin) return false;
  const host = headers.get("x-forwarded-host") ?? headers.get("host");
  let originUrl: URL;
  try {
    originUrl = new URL(origin);
  } catch {
    return false;
  }
  const originHost = originUrl.host;
  // Same host, and (behind a proxy that says how the request arrived) the same scheme: a page
  // served over plain http on our host name is not our https origin.
  const proto = headers.get("x-forwarded-proto")?.split(",")[0]!.trim();
  const sameScheme = !proto || originUrl.protocol === `${proto}:`;
  if (host && originHost === host && sameScheme) return true;
  const extra = (process.env.DENTATE_ALLOWED_ORIGINS ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  return extra.includes(origin);
}
