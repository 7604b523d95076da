// The audit trail's filter: an impossible day in the query string (2024-13-45: month 13, day 45;
// ISO 8601 months run 01–12 and days to 28–31) gets the form's message and the page still answers,
// where it used to reach PostgreSQL as a date literal and fail the page with a 500.
import { describe, expect, it } from "vitest";
import { listAuditEvents } from "@/db/queries/audit-trail";
import { readAuditFilter } from "@/lib/validation/audit";
import { makeSite } from "../fixtures/factory";

describe("audit trail filter dates", () => {
  it("answers /audit?from=2024-13-45 with the form's message and a list without that filter", async () => {
    const siteId = (await makeSite("Audit")).id;
    const { filter, errors } = readAuditFilter({ from: "2024-13-45", to: "2025-01-31" });
    expect(errors).toEqual({ from: "Not a real date." });
    expect(filter).toEqual({ to: "2025-01-31" });
    const list = await listAuditEvents([siteId], { fromDate: filter.from, toDate: filter.to, page: 1 });
    expect(list.page).toBe(1);
  });

  it("refuses an end date before the start date on the end field", () => {
    expect(readAuditFilter({ from: "2025-02-01", to: "2025-01-01" }).errors).toEqual({ to: "The end date cannot come before the start date." });
    expect(readAuditFilter({ from: "2024-02-29", to: ["2024-03-01"] })).toEqual({ filter: { from: "2024-02-29", to: "2024-03-01" }, errors: {} });
  });
});
