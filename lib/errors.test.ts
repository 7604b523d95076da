import { describe, expect, it, vi } from "vitest";
import { AppError, errorToBody, isRefusedData } from "./errors";

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
