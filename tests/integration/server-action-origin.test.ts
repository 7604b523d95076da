// Server actions answer to the same Origin rule as route handlers: a POST without our Origin is
// refused before anything is read or written. OWASP CSRF Prevention Cheat Sheet, "Verifying
// Origin with standard headers" (refuse when the header is absent; from memory). Every file with
// "use server" under app/ and lib/ is found on disk, so an action added later is checked too.
// Only Next's request context (headers, cookies, redirect, revalidation) is stood in for here:
// outside a running server it does not exist. The database is the real one.
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { eq, sql as dsql } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { createSession, SESSION_COOKIE } from "@/lib/auth/session";
import { makePatient, makeSite, makeUser } from "../fixtures/factory";

const request = vi.hoisted(() => ({ headers: new Headers(), set: [] as string[], attributes: [] as unknown[] }));
vi.mock("next/headers", () => ({
  headers: async () => request.headers,
  cookies: async () => ({
    get: (name: string) => {
      const m = (request.headers.get("cookie") ?? "").match(new RegExp(`${name}=([^;]+)`));
      return m ? { name, value: m[1] } : undefined;
    },
    set: (name: string, _value: string, attributes: unknown) => {
      request.set.push(name);
      request.attributes.push(attributes);
    },
  }),
}));
vi.mock("next/navigation", () => ({ redirect: (to: string) => { throw Object.assign(new Error(`redirect ${to}`), { redirectTo: to }); } }));
vi.mock("next/cache", () => ({ revalidatePath: () => undefined }));

const ROOT = path.resolve(import.meta.dirname, "../..");
function actionFiles(dir: string, out: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) actionFiles(full, out);
    else if (/\.tsx?$/.test(name) && !name.includes(".test.") && /^\s*["']use server["']/.test(readFileSync(full, "utf8"))) out.push(full);
  }
  return out;
}
const files = [...actionFiles(path.join(ROOT, "app")), ...actionFiles(path.join(ROOT, "lib"))];

async function auditCount() {
  const [{ n }] = await db.select({ n: dsql<number>`count(*)::int` }).from(auditEvents);
  return n;
}

let email: string;
let cookie: string;
let patientId: string;
beforeEach(async () => {
  const site = await makeSite();
  email = `a-${randomUUID()}@test.example`;
  const userId = await makeUser("clinician", [site.id], { email, passwordHash: await hashPassword("an invented long passphrase") });
  cookie = `${SESSION_COOKIE}=${await createSession(userId)}`;
  patientId = (await makePatient(site.id)).id;
  request.set = [];
  request.attributes = [];
});

function form() {
  const f = new FormData();
  for (const [k, v] of Object.entries({ email, password: "an invented long passphrase", patientId, mode: "set", date: "2031-05-01", reason: "Seen elsewhere last month" })) f.set(k, v);
  return f;
}

async function callEvery(headers: Record<string, string>) {
  const outcomes: { name: string; outcome: unknown }[] = [];
  for (const file of files) {
    const mod = (await import(/* @vite-ignore */ file)) as Record<string, unknown>;
    for (const [name, fn] of Object.entries(mod)) {
      if (typeof fn !== "function") continue;
      request.headers = new Headers({ host: "dentate.test", cookie, "x-dentate-peer": "10.50.0.1", ...headers });
      const outcome = await (fn as (...a: unknown[]) => Promise<unknown>)({}, form()).then((r) => r, (e: unknown) => e);
      outcomes.push({ name: `${path.relative(ROOT, file)} ${name}`, outcome });
    }
  }
  return outcomes;
}

describe("server actions", () => {
  it("finds the actions to check", () => {
    expect(files.map((f) => path.relative(ROOT, f))).toEqual(expect.arrayContaining(["app/(auth)/sign-in/actions.ts", "lib/auth/sign-out-action.ts"]));
  });

  it("refuse a request with no Origin, as route handlers do, and read or write nothing", async () => {
    const before = await auditCount();
    const outcomes = await callEvery({});
    for (const { name, outcome } of outcomes) {
      const message = outcome instanceof Error ? outcome.message : (outcome as { message?: string } | null)?.message;
      expect(message, name).toBe("This request did not come from a Dentate page.");
    }
    expect(await auditCount()).toBe(before);
    expect(request.set).toEqual([]);
  });

  it("refuse a foreign Origin too, and accept our own (the sign-in action signs in)", async () => {
    for (const { name, outcome } of await callEvery({ origin: "http://evil.example" })) {
      const message = outcome instanceof Error ? outcome.message : (outcome as { message?: string } | null)?.message;
      expect(message, name).toBe("This request did not come from a Dentate page.");
    }
    request.headers = new Headers({ host: "dentate.test", origin: "http://dentate.test", "x-dentate-peer": "10.50.0.2" });
    const { signInAction } = await import("@/app/(auth)/sign-in/actions");
    const signedIn = await signInAction({}, form()).catch((e: { redirectTo?: string }) => e.redirectTo);
    expect(signedIn).toBe("/patients");
    expect(request.set).toEqual([SESSION_COOKIE]);
    const rows = await db.select().from(auditEvents).where(eq(auditEvents.action, "sign_in.succeeded"));
    expect(rows.length).toBeGreaterThan(0);
  });

  // The Secure attribute keeps the cookie off plain http (RFC 6265 §4.1.2.5). With TLS ended at a
  // proxy that sends no X-Forwarded-Proto, only the configured public address can tell.
  it("marks the session cookie Secure whenever APP_BASE_URL is https, though the request itself says nothing of TLS", async () => {
    const saved = process.env.APP_BASE_URL;
    process.env.APP_BASE_URL = "https://dentate.clinic.example";
    try {
      request.headers = new Headers({ host: "dentate.test", origin: "http://dentate.test", "x-dentate-peer": "10.50.0.3", "x-dentate-peer-proto": "http" });
      const { signInAction } = await import("@/app/(auth)/sign-in/actions");
      await signInAction({}, form()).catch(() => null);
      expect(request.set).toEqual([SESSION_COOKIE]);
      expect(request.attributes[0]).toMatchObject({ secure: true, httpOnly: true });
    } finally {
      process.env.APP_BASE_URL = saved;
    }
  });
});
