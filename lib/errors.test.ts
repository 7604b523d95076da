import { describe, expect, it, vi } from "vitest";
import { AppError, errorToBody, isDatabaseDown, isRefusedData } from "./errors";

// SQLSTATE class 22 is "data exception" (PostgreSQL manual, Appendix A "PostgreSQL Error Codes"):
// 22021 character_not_in_repertoire (a NUL byte in text), 22008 datetime_field_overflow.
describe("errorToBody for values the database cannot store", () => {
  it("answers a data exception with 400, also when wrapped as the cause of a query error", () => {
    const pg = Object.assign(new Error("invalid byte sequence for encoding \"UTF8\": 0x00"), { code: "22021", severity: "ERROR" });
    expect(errorToBody(pg).status).toBe(400);
    const wrapped = Object.assign(new Error("Failed query: insert …"), { cause: Object.assign(new Error("date/time field value out of range"), { code: "22008", severity: "ERROR" }) });
    const { status, body } = errorToBody(wrapped);
    expect(status).toBe(400);
    expect(body.error.code).toBe("invalid");
    expect(isRefusedData(wrapped)).toBe(true);
  });

  it("still answers 500 for other server errors, and AppErrors keep their own status", () => {
    const spy = vi.spyOn(console, "error").mockImplementation(() => {});
    expect(errorToBody(Object.assign(new Error("x"), { code: "23505", severity: "ERROR" })).status).toBe(500); // unique_violation: class 23
    expect(errorToBody(Object.assign(new Error("x"), { code: "22021" })).status).toBe(500); // not from the database driver
    spy.mockRestore();
    expect(errorToBody(new AppError("conflict")).status).toBe(409);
  });
});

describe("isDatabaseDown for a database reached through its Unix socket", () => {
  // Node's own errors (Node.js docs, "Errors": system errors carry `code` and `syscall`): connecting
  // to a socket path that does not exist (a stopped PostgreSQL removes its socket file) fails with
  // ENOENT from `connect`; a missing file read fails with ENOENT from `open`, which is not an outage.
  it("counts a refused socket connection as an outage (503) and a missing file as an error (500)", async () => {
    const { createConnection } = await import("node:net");
    const { readFile } = await import("node:fs/promises");
    const connectErr = await new Promise<Error>((resolve) => createConnection("/nonexistent-dentate-dir/.s.PGSQL.5432").on("error", resolve));
    expect(connectErr).toMatchObject({ code: "ENOENT", syscall: "connect" });
    expect(isDatabaseDown(connectErr)).toBe(true);
    expect(errorToBody(Object.assign(new Error("Failed query"), { cause: connectErr })).status).toBe(503);
    const fileErr = await readFile("/nonexistent-dentate-dir/file").catch((e: Error) => e);
    expect(fileErr).toMatchObject({ code: "ENOENT", syscall: "open" });
    expect(isDatabaseDown(fileErr)).toBe(false);
  });
});
