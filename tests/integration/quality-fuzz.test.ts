// Property-based fuzzing (fast-check) of every mutating endpoint found under app/api: hostile
// bodies, wrongly typed fields and malformed ids, sent as the right role of the right site.
// Expected behaviour (DEVELOPERS.md "Layering" 4-5 and OWASP ASVS 4.0.3 V5.1.3, input
// validation with a positive allow-list; V7.4.1, a generic message and no stack trace on error):
// every refusal is a 4xx JSON answer with error.message, never a 5xx, and a refused request
// leaves every application table byte-for-byte unchanged (tests/support/db-checksum.ts).
import { beforeAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import type { Role } from "@/lib/domain/vocab";
import { ORIGIN, ctx, type Actor } from "../fixtures/factory";
import { fillPath, loadRoutes, safeEncode, MUTATING_METHODS, type RouteEntry } from "../support/route-catalog";
import { makeWorld, paramsFor, type World } from "../support/fixture-world";
import { SPECS } from "../support/route-requests";
import { changedTables, tableChecksums } from "../support/db-checksum";
import { BOUNDARY_NUMBERS, BOUNDARY_STRINGS, boundaryFor, hostileRawBodies, hostileStrings, wrongTypeFor } from "../support/hostile";

const RUNS = 15;
// Public routes that wait a fixed minimum time per answer (timing equalisation) get fewer runs.
const SLOW_PUBLIC_RUNS = 4;

// Well-formed bodies for the public routes (tokens are 43 url-safe characters, unknown here).
const PUBLIC_BODIES: Record<string, unknown> = {
  "POST /api/auth/accept-invite": { token: "A".repeat(43), displayName: "Invented Person", password: "a long invented passphrase" },
  "POST /api/auth/forgot-password": { email: "nobody@test.example" },
  "POST /api/auth/reset-password": { token: "A".repeat(43), password: "a long invented passphrase" },
};

let routes: RouteEntry[];
let w: World;

beforeAll(async () => {
  routes = (await loadRoutes()).filter((r) => MUTATING_METHODS.has(r.method));
  w = await makeWorld();
});

function who(r: RouteEntry): Actor | null {
  const roles = r.handler.dentateRoles;
  if (roles === "public") return null;
  return w.a[(roles === "any" ? "clinician" : roles![0]) as Role];
}

function paramsOf(r: RouteEntry): Record<string, string> {
  const spec = SPECS[r.key] ?? {};
  const all = { ...paramsFor(w.ids), ...(spec.params?.(w) ?? {}) };
  return Object.fromEntries(r.params.map((p) => [p, all[p]!]));
}

async function send(r: RouteEntry, opts: { body?: string; params?: Record<string, string>; query?: string }) {
  const params = opts.params ?? paramsOf(r);
  const spec = SPECS[r.key] ?? {};
  const query = opts.query ?? spec.query?.(w) ?? "";
  const actor = who(r);
  const headers: Record<string, string> = { host: "dentate.test", origin: ORIGIN, "x-dentate-peer": `10.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}.7` };
  if (actor) headers.cookie = actor.cookie;
  if (opts.body !== undefined) headers["content-type"] = "application/json";
  const request = new Request(`${ORIGIN}${fillPath(r.pattern, params)}${query}`, { method: r.method, headers, body: opts.body });
  const res = await r.handler(request, ctx(params) as never);
  const text = await res.text();
  let json: { error?: { message?: unknown } } | null = null;
  try {
    json = JSON.parse(text);
  } catch {
    json = null;
  }
  return { status: res.status, json, text };
}

function expectRefusal(r: RouteEntry, what: string, res: Awaited<ReturnType<typeof send>>) {
  const ok = res.status >= 400 && res.status < 500 && typeof res.json?.error?.message === "string" && res.json.error.message.length > 0;
  if (!ok) throw new Error(`${r.key} with ${what.slice(0, 200)}: ${res.status} ${res.text.slice(0, 300)}`);
}

function baseBody(r: RouteEntry): Record<string, unknown> | null {
  if (PUBLIC_BODIES[r.key]) return PUBLIC_BODIES[r.key] as Record<string, unknown>;
  const body = SPECS[r.key]?.body;
  if (body === "multipart") return {};
  if (typeof body === "function") return body(w) as Record<string, unknown>;
  return null;
}

/** Hostile requests that no schema may accept, for one route. */
function mustRefuse(r: RouteEntry): fc.Arbitrary<{ what: string; body?: string; params?: Record<string, string>; query?: string }> {
  const base = baseBody(r);
  const params = paramsOf(r);
  const options: fc.Arbitrary<{ what: string; body?: string; params?: Record<string, string>; query?: string }>[] = [];
  if (base) {
    options.push(hostileRawBodies.map((body) => ({ what: `raw body ${JSON.stringify(body.slice(0, 80))}`, body })));
    const keys = Object.keys(base);
    if (keys.length) {
      options.push(
        fc.constantFrom(...keys).chain((k) => wrongTypeFor(base[k]).map((v) => ({ what: `${k}=${JSON.stringify(v)}`, body: JSON.stringify({ ...base, [k]: v }) }))),
      );
    }
  }
  // Malformed ids in the path: a route must answer 404 (idParam), never reach the database with them.
  if (r.params.length) {
    options.push(
      fc.constantFrom(...r.params).chain((p) =>
        hostileStrings.filter((s) => s !== params[p]).map((v) => ({ what: `param ${p}=${JSON.stringify(v)}`, params: { ...params, [p]: v }, body: base ? JSON.stringify(base) : undefined })),
      ),
    );
  }
  const spec = SPECS[r.key];
  if (spec?.query && r.method !== "GET") {
    const name = spec.query(w).replace(/^\?/, "").split("=")[0]!;
    options.push(hostileStrings.filter((s) => !/^\s*\d+\s*$/.test(s) && !/^[A-Z]\d{2}(\.\d{1,4})?$/.test(s.trim())).map((v) => ({ what: `query ${name}=${JSON.stringify(v)}`, query: `?${name}=${safeEncode(v)}` })));
  }
  return fc.oneof(...options);
}

describe("fuzzing every mutating endpoint", () => {
  it("finds the mutating endpoints on disk", () => {
    expect(routes.length).toBeGreaterThan(25);
  });

  it("refuses every hostile request with a 4xx JSON message and writes nothing", async () => {
    const failures: string[] = [];
    for (const r of routes) {
      const base = baseBody(r);
      if (!base && r.params.length === 0 && !SPECS[r.key]?.query) continue;
      const before = await tableChecksums();
      const runs = r.key === "POST /api/auth/forgot-password" ? SLOW_PUBLIC_RUNS : RUNS;
      try {
        await fc.assert(
          fc.asyncProperty(mustRefuse(r), async (c) => expectRefusal(r, c.what, await send(r, c))),
          { numRuns: runs, seed: 8080, endOnFailure: true },
        );
      } catch (err) {
        failures.push(String((err as Error).message).split("\n").find((l) => l.includes(r.key)) ?? `${r.key}: ${(err as Error).message.slice(0, 300)}`);
      }
      const changed = changedTables(before, await tableChecksums());
      if (changed.length) failures.push(`${r.key}: refused requests changed ${changed.join(", ")}`);
    }
    expect(failures).toEqual([]);
  }, 120_000);

  it("never answers 5xx to boundary values of the right type (huge, negative, -0, empty, 10k chars, NUL, unicode)", async () => {
    const failures: string[] = [];
    for (const r of routes) {
      const base = baseBody(r);
      if (!base || r.handler.dentateRoles === "public" || Object.keys(base).length === 0) continue;
      const keys = Object.keys(base);
      const arb = fc.constantFrom(...keys).chain((k) => boundaryFor(base[k]).map((v) => ({ what: `${k}=${JSON.stringify(v)?.slice(0, 80)}`, body: JSON.stringify({ ...base, [k]: v }) })));
      // Every listed edge value in every field of its type, once; then random ones.
      for (const k of keys) {
        const edges: unknown[] = typeof base[k] === "number" ? BOUNDARY_NUMBERS : typeof base[k] === "string" ? BOUNDARY_STRINGS : [];
        for (const v of edges) {
          const res = await send(r, { body: JSON.stringify({ ...base, [k]: v }) });
          const what = `${k}=${JSON.stringify(v).slice(0, 60)}`;
          if (res.status >= 500) failures.push(`${r.key} with ${what}: ${res.status} ${res.text.slice(0, 160)}`);
          else if (res.status >= 400 && typeof res.json?.error?.message !== "string") failures.push(`${r.key} with ${what}: ${res.status} without a message`);
        }
      }
      try {
        await fc.assert(
          fc.asyncProperty(arb, async (c) => {
            const res = await send(r, c);
            if (res.status >= 500) throw new Error(`${r.key} with ${c.what}: ${res.status} ${res.text.slice(0, 200)}`);
            if (res.status >= 400) expectRefusal(r, c.what, res);
          }),
          { numRuns: RUNS, seed: 4242, endOnFailure: true },
        );
      } catch (err) {
        failures.push(String((err as Error).message).split("\n").find((l) => l.includes(r.key)) ?? `${r.key}: ${(err as Error).message.slice(0, 300)}`);
      }
    }
    expect(failures).toEqual([]);
  }, 120_000);
});

