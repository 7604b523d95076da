// Pages and server actions: a fresh CSP nonce per request (Next.js reads it from the request's
// Content-Security-Policy header and puts it on its own scripts) and the security headers of
// lib/http/security-headers.ts. API routes set the same headers in their wrappers (lib/http), so
// this proxy skips /api: a proxy on every API request costs about half the API's throughput.
import { NextResponse, type NextRequest } from "next/server";
import { isHttps } from "@/lib/auth/request-info";
import { pageHeaders } from "@/lib/http/security-headers";

export function proxy(request: NextRequest) {
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString("base64");
  const headers = pageHeaders(nonce, { https: isHttps(request.headers), dev: process.env.NODE_ENV === "development" });
  const forward = new Headers(request.headers);
  forward.set("x-nonce", nonce);
  forward.set("content-security-policy", headers["content-security-policy"]!);
  const response = NextResponse.next({ request: { headers: forward } });
  for (const [k, v] of Object.entries(headers)) response.headers.set(k, v);
  return response;
}

export const config = {
  matcher: [
    // Everything but the API, Next's static files and image optimiser, and files with an extension.
    { source: "/((?!api/|_next/static|_next/image|.*\\.[a-zA-Z0-9]+$).*)" },
  ],
};
