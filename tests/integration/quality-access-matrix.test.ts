// The route × role matrix, generated from one table of who may do what (tests/support/access-table)
// and the route files on disk (tests/support/route-catalog): every handler carries a guard marker
// and appears in the table with the roles it declares; without a session it answers 401, to a role it does not
// list 403, to a listed role of another site addressing site A's record 404 (a record of another
// site is answered as if it did not exist: DEVELOPERS.md, "One guard, one error type"), and to
// the right role of site A it gets through. OWASP ASVS 4.0.3 V4.1.3 (least privilege, deny by
// default) and V4.2.1 (protection against insecure direct object references) are the checks.
import { beforeAll, describe, expect, it } from "vitest";
import { ROLES, type Role } from "@/lib/domain/vocab";
import { ORIGIN, ctx, type Actor } from "../fixtures/factory";
import { fillPath, loadRoutes, MUTATING_METHODS, type RouteEntry } from "../support/route-catalog";
import { makeRecords, makeWorld, paramsFor, type World } from "../support/fixture-world";
import { PUBLIC_ROUTES, SPECS } from "../support/route-requests";
import { ACCESS } from "../support/access-table";
import { changedTables, tableChecksums } from "../support/db-checksum";

let routes: RouteEntry[];
let w: World;

beforeAll(async () => {
  routes = await loadRoutes();
  w = await makeWorld();
});

function build(r: RouteEntry, who: Actor | null, world: World): { request: Request; context: ReturnType<typeof ctx> } {
  const spec = SPECS[r.key] ?? {};
  const params = { ...paramsFor(world.ids), ...(spec.params?.(world) ?? {}) };
  const url = `${ORIGIN}${fillPath(r.pattern, params)}${spec.query?.(world) ?? ""}`;
  const headers: Record<string, string> = { host: "dentate.test" };
  if (who) headers.cookie = who.cookie;
  if (MUTATING_METHODS.has(r.method)) headers.origin = ORIGIN;
  let body: BodyInit | undefined;
  if (spec.body === "multipart") {
    const form = new FormData();
    form.set("file", new File([new Uint8Array([0x89, 0x50, 0x4e, 0x47])], "x.png", { type: "image/png" }));
    body = form;
  } else if (typeof spec.body === "function") {
    headers["content-type"] = "application/json";
    body = JSON.stringify(spec.body(world));
  }
  const ownParams = Object.fromEntries(r.params.map((p) => [p, params[p]!]));
  return { request: new Request(url, { method: r.method, headers, body }), context: ctx(ownParams) };
}

async function call(r: RouteEntry, who: Actor | null, world: World = w) {
  const { request, context } = build(r, who, world);
  const res = await r.handler(request, context as never);
  let body: unknown = null;
  const text = await res.text();
  try {
    body = JSON.parse(text);
  } catch {
    body = text;
  }
  return { status: res.status, body, text };
}

const guarded = () => routes.filter((r) => r.handler.dentateRoles !== "public");
// Expectations come from the access table; a route missing from it is expected to allow no role,
// so every check below reports it too (besides the table check).
const rolesOf = (r: RouteEntry): readonly string[] | "any" => {
  const a = ACCESS[r.key];
  return a === undefined || a === "public" ? [] : a;
};
const sameRoles = (a: unknown, b: unknown) =>
  a === b || (Array.isArray(a) && Array.isArray(b) && a.length === b.length && [...a].sort().join() === [...b].sort().join());

describe("route × role matrix (generated from app/api/**/route.ts)", () => {
  it("finds the route files and every handler carries a guard marker", () => {
    expect(routes.length).toBeGreaterThan(30);
    const problems: string[] = [];
    for (const r of routes) {
      const roles = r.handler.dentateRoles;
      if (roles === undefined) problems.push(`${r.key}: a new route handler without a guard (use route() or publicRoute())`);
      else if (roles === "public" && !PUBLIC_ROUTES.has(r.key)) problems.push(`${r.key}: a new public route; add it to PUBLIC_ROUTES only on purpose`);
      else if (roles !== "public" && roles !== "any" && (!Array.isArray(roles) || roles.length === 0 || roles.some((x) => !(ROLES as readonly string[]).includes(x))))
        problems.push(`${r.key}: roles must be a non-empty list of known roles`);
      if (MUTATING_METHODS.has(r.method) && roles !== "public" && !SPECS[r.key]?.body) problems.push(`${r.key}: no minimal request in tests/support/route-requests.ts`);
    }
    for (const r of routes) {
      if (!(r.key in ACCESS)) problems.push(`${r.key}: missing from tests/support/access-table.ts (say who may call it)`);
      else if (!sameRoles(ACCESS[r.key], r.handler.dentateRoles)) problems.push(`${r.key}: declares ${JSON.stringify(r.handler.dentateRoles)} but the access table says ${JSON.stringify(ACCESS[r.key])}`);
    }
    for (const key of Object.keys(ACCESS)) if (!routes.some((r) => r.key === key)) problems.push(`${key}: in the access table but no such route`);
    for (const key of PUBLIC_ROUTES) if (!routes.some((r) => r.key === key && r.handler.dentateRoles === "public")) problems.push(`${key}: expected public route is missing or no longer public`);
    expect(problems).toEqual([]);
  });

  it("refuses: no session → 401, an unlisted role → 403, another site's record → 404; and writes nothing", async () => {
    const before = await tableChecksums();
    const failures: string[] = [];
    for (const r of guarded()) {
      const roles = rolesOf(r);
      const spec = SPECS[r.key] ?? {};
      const anon = await call(r, null);
      if (anon.status !== 401) failures.push(`${r.key} without a session: ${anon.status}`);
      for (const role of ROLES) {
        if (roles === "any" || roles.includes(role)) continue;
        const res = await call(r, w.a[role]);
        if (res.status !== 403) failures.push(`${r.key} as ${role} of site A: ${res.status} (expected 403)`);
      }
      const allowed = roles === "any" ? ROLES : (roles as Role[]);
      for (const role of allowed) {
        if (spec.noSiteRecord && MUTATING_METHODS.has(r.method)) continue;
        const res = await call(r, w.b[role]);
        if (spec.noSiteRecord) {
          if (res.status >= 500) failures.push(`${r.key} as ${role} of site B: ${res.status}`);
          // A list answered to site B must not mention any record of site A.
          for (const [name, id] of Object.entries(w.ids)) if (res.text.includes(id)) failures.push(`${r.key} as ${role} of site B leaks site A's ${name}`);
        } else if (res.status !== 404) failures.push(`${r.key} as ${role} of site B on site A's record: ${res.status} (expected 404)`);
      }
    }
    expect(failures).toEqual([]);
    expect(changedTables(before, await tableChecksums())).toEqual([]);
  });

  it("answers 2xx to every listed role of site A on reads", async () => {
    const failures: string[] = [];
    for (const r of guarded().filter((x) => x.method === "GET")) {
      if (SPECS[r.key]?.skipRightRole) continue;
      const roles = rolesOf(r);
      for (const role of roles === "any" ? ROLES : (roles as Role[])) {
        const res = await call(r, w.a[role]);
        if (res.status < 200 || res.status > 299) failures.push(`${r.key} as ${role} of site A: ${res.status} ${res.text.slice(0, 160)}`);
      }
    }
    expect(failures).toEqual([]);
  });

  it("refuses the research nurse every identified visit and patient read (403)", async () => {
    // The nurse's role is de-identified study data; a visit's record carries exact dates, the
    // examiner's name, free text and the patient id.
    const reads = guarded().filter((r) => r.method === "GET" && /^\/api\/(visits|patients|reviews|biopsies|attachments)\b/.test(r.pattern));
    expect(reads.map((r) => r.key)).toContain("GET /api/visits/[visitId]/lesions");
    const opened: string[] = [];
    for (const r of reads) {
      const res = await call(r, w.a.research_nurse);
      if (res.status !== 403) opened.push(`${r.key}: ${res.status}`);
    }
    expect(opened).toEqual([]);
  });

  it("lets the first listed role of site A through on mutations (fresh records for each)", async () => {
    const failures: string[] = [];
    for (const r of guarded().filter((x) => MUTATING_METHODS.has(x.method))) {
      const spec = SPECS[r.key]!;
      if (spec.skipRightRole) continue;
      const roles = rolesOf(r);
      if (roles !== "any" && roles.length === 0) continue;
      const role: Role = roles === "any" ? "clinician" : (roles[0] as Role);
      const fresh: World = { ...w, ids: await makeRecords(w.siteA, w.a) };
      const res = await call(r, w.a[role], fresh);
      if ([401, 403, 404].includes(res.status) || res.status >= 500) failures.push(`${r.key} as ${role} of site A: ${res.status} ${res.text.slice(0, 200)}`);
    }
    expect(failures).toEqual([]);
  });
});
