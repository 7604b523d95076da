// Every API handler (found on disk, so a new one is covered) answers with the security headers,
// whatever the outcome: signed out (401), refused origin (403), a read with the right role (2xx,
// streams included). Pages get the same headers from proxy.ts (lib/http/proxy.test.ts) and
// tests/e2e/quality-headers.test.ts checks both against the running app.
// Sources (from memory): OWASP HTTP Headers Cheat Sheet; MDN "Content-Security-Policy",
// "Strict-Transport-Security" (only over https).
import { afterEach, beforeAll, describe, expect, it } from "vitest";
import type { Role } from "@/lib/domain/vocab";
import { ORIGIN, type Actor } from "../fixtures/factory";
import { fillPath, loadRoutes, MUTATING_METHODS, type RouteEntry } from "../support/route-catalog";
import { makeWorld, paramsFor, type World } from "../support/fixture-world";
import { SPECS } from "../support/route-requests";

let w: World;
let routes: RouteEntry[];
beforeAll(async () => {
  w = await makeWorld();
  routes = await loadRoutes();
});
const savedBase = process.env.APP_BASE_URL;
afterEach(() => {
  process.env.APP_BASE_URL = savedBase;
});

function request(r: RouteEntry, who: Actor | null, origin: string | null): Request {
  const spec = SPECS[r.key] ?? {};
  const all = { ...paramsFor(w.ids), ...(spec.params?.(w) ?? {}) };
  const headers: Record<string, string> = { host: "dentate.test", "content-type": "application/json", "x-dentate-peer": "10.60.0.1" };
  if (who) headers.cookie = who.cookie;
  if (origin) headers.origin = origin;
  const body = MUTATING_METHODS.has(r.method) ? JSON.stringify(typeof spec.body === "function" ? spec.body(w) : {}) : undefined;
  return new Request(`${ORIGIN}${fillPath(r.pattern, all)}${spec.query?.(w) ?? ""}`, { method: r.method, headers, body });
}

function missing(res: Response, https: boolean): string[] {
  const want: Record<string, RegExp> = {
    "content-security-policy": /default-src 'none'.*frame-ancestors 'none'/,
    "x-frame-options": /^DENY$/,
    "x-content-type-options": /^nosniff$/,
    "referrer-policy": /^(same-origin|no-referrer|strict-origin)$/,
    "permissions-policy": /camera=\(\).*geolocation=\(\)/,
  };
  const out = Object.entries(want).filter(([k, re]) => !re.test(res.headers.get(k) ?? "")).map(([k]) => k);
  if (https !== /max-age=\d{7,}/.test(res.headers.get("strict-transport-security") ?? "")) out.push(`strict-transport-security (https: ${https})`);
  return out;
}

async function walk(https: boolean) {
  process.env.APP_BASE_URL = https ? "https://dentate.clinic.example" : "http://dentate.test";
  const problems: string[] = [];
  for (const r of routes) {
    const roles = r.handler.dentateRoles;
    const role = (roles === "public" || roles === "any" ? "clinician" : roles![0]) as Role;
    const all = { ...paramsFor(w.ids), ...(SPECS[r.key]?.params?.(w) ?? {}) };
    const ctx = { params: Promise.resolve(Object.fromEntries(r.params.map((p) => [p, all[p] ?? ""]))) };
    const attempts: [string, Request][] = [["signed out", request(r, null, ORIGIN)]];
    // A mutation from another origin is refused before anything is written; a read is made for real.
    attempts.push(MUTATING_METHODS.has(r.method) ? ["foreign origin", request(r, w.a[role], "http://evil.example")] : ["signed in", request(r, w.a[role], null)]);
    for (const [label, req] of attempts) {
      const res = await r.handler(req, ctx);
      const gaps = missing(res, https);
      if (gaps.length) problems.push(`${r.key} (${label}, ${res.status}): ${gaps.join(", ")}`);
      await res.body?.cancel().catch(() => {});
    }
  }
  return problems;
}

describe("security headers on every API response", () => {
  it("are on every handler's answer, signed in or out, allowed or refused; no HSTS over plain http", async () => {
    expect(routes.length).toBeGreaterThan(40);
    expect(await walk(false)).toEqual([]);
  });

  it("add Strict-Transport-Security when the public address is https", async () => {
    expect(await walk(true)).toEqual([]);
  });
});
