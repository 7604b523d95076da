// Page reads of identified data leave an audit row with the client's address, taken by the same
// trusted-proxy rule as the API (HIPAA Security Rule, 45 CFR 164.312(b), audit controls).
// Only Next's request context (headers, cookies, redirect, notFound) is stood in for here: outside a
// running server it does not exist. The database is the real one.
import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { auditEvents } from "@/db/schema";
import { createSession, SESSION_COOKIE } from "@/lib/auth/session";
import { makePatient, makeSite, makeUser } from "../fixtures/factory";

const request = vi.hoisted(() => ({ headers: new Headers() }));
vi.mock("next/headers", () => ({
  headers: async () => request.headers,
  cookies: async () => ({
    get: (name: string) => {
      const m = (request.headers.get("cookie") ?? "").match(new RegExp(`${name}=([^;]+)`));
      return m ? { name, value: m[1] } : undefined;
    },
    set: () => undefined,
  }),
}));
vi.mock("next/navigation", () => ({
  redirect: (to: string) => { throw Object.assign(new Error(`redirect ${to}`), { redirectTo: to }); },
  notFound: () => { throw new Error("not found"); },
}));

let userId: string, patientId: string;
beforeAll(async () => {
  const site = await makeSite("PageReads");
  userId = await makeUser("clinician", [site.id], { email: `p-${randomUUID()}@test.example` });
  patientId = (await makePatient(site.id)).id;
  request.headers = new Headers({ host: "dentate.test", cookie: `${SESSION_COOKIE}=${await createSession(userId)}`, "x-dentate-peer": "10.70.0.7" });
});

const rowsOf = (action: string) => db.select().from(auditEvents).where(and(eq(auditEvents.userId, userId), eq(auditEvents.action, action)));

describe("page reads record who read what, and from where", () => {
  it("the biopsies worklist page records one read with the client's address", async () => {
    const { default: BiopsiesPage } = await import("@/app/(clinic)/biopsies/page");
    await BiopsiesPage();
    const rows = await rowsOf("biopsy.worklist.read");
    expect(rows).toHaveLength(1);
    expect(rows[0]!.ip).toBe("10.70.0.7");
  });

  it("the patient page records its read with the client's address", async () => {
    const { default: PatientPage } = await import("@/app/(clinic)/patients/[patientId]/page");
    await PatientPage({ params: Promise.resolve({ patientId }) } as never);
    const [row] = await rowsOf("patient.read");
    expect(row?.patientId).toBe(patientId);
    expect(row?.ip).toBe("10.70.0.7");
  });
});
