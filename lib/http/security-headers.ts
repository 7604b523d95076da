// The security headers every page and API response carries, in one place: the proxy (pages,
// server actions) and the route wrappers (app/api) both take them from here.
// Sources: MDN "Content-Security-Policy" (nonce-source, 'strict-dynamic', frame-ancestors),
// OWASP HTTP Headers Cheat Sheet (X-Content-Type-Options nosniff, X-Frame-Options DENY,
// Referrer-Policy, Permissions-Policy, Strict-Transport-Security): from memory.

export interface HeaderContext {
  /** Served over https (the public address is https, or the request came over https). */
  https: boolean;
  /** `next dev`: its client needs eval and inline styles for hot reloading. */
  dev?: boolean;
}

// Browser features Dentate never uses (the camera is reached through a file input, which needs
// no permission): denied to the page and to anything it might frame.
const PERMISSIONS = ["camera", "microphone", "geolocation", "payment", "usb", "serial", "bluetooth", "midi", "hid", "accelerometer", "gyroscope", "magnetometer", "display-capture", "browsing-topics", "interest-cohort"];

function common(ctx: HeaderContext): Record<string, string> {
  const h: Record<string, string> = {
    "x-content-type-options": "nosniff",
    "x-frame-options": "DENY",
    "referrer-policy": "same-origin",
    "permissions-policy": PERMISSIONS.map((p) => `${p}=()`).join(", "),
    "cross-origin-opener-policy": "same-origin",
  };
  // Two years, as browsers' preload lists expect; only once the site is https.
  if (ctx.https) h["strict-transport-security"] = "max-age=63072000; includeSubDomains";
  return h;
}

/** A page's policy: scripts only from us or carrying this response's nonce. */
export function pageCsp(nonce: string, ctx: HeaderContext): string {
  const directives = [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${ctx.dev ? " 'unsafe-eval'" : ""}`,
    // Style sheets are ours; style attributes (React's `style`, the charts' SVG) stay allowed.
    ctx.dev ? "style-src 'self' 'unsafe-inline'" : `style-src 'self' 'nonce-${nonce}'`,
    "style-src-attr 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    `connect-src 'self'${ctx.dev ? " ws:" : ""}`,
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ];
  if (ctx.https) directives.push("upgrade-insecure-requests");
  return directives.join("; ");
}

/** An API answer is never a document to run: nothing may load from it or frame it. */
export const API_CSP = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'";

export function pageHeaders(nonce: string, ctx: HeaderContext): Record<string, string> {
  return { ...common(ctx), "content-security-policy": pageCsp(nonce, ctx) };
}

export function apiHeaders(ctx: HeaderContext): Record<string, string> {
  return { ...common(ctx), "content-security-policy": API_CSP };
}

/** The response with the API headers set (a copy when its headers are immutable). */
export function withApiHeaders(res: Response, ctx: HeaderContext): Response {
  const h = apiHeaders(ctx);
  try {
    for (const [k, v] of Object.entries(h)) res.headers.set(k, v);
    return res;
  } catch {
    const copy = new Response(res.body, { status: res.status, statusText: res.statusText, headers: res.headers });
    for (const [k, v] of Object.entries(h)) copy.headers.set(k, v);
    return copy;
  }
}
