import { describe, expect, it } from "vitest";
import { accountChangeRefusal } from "./admin-rights";

// Separation of duties across sites and "keep at least one administrator": common practice, no source.
const base = { adminSiteIds: ["north", "south"], sitesWithAnotherAdmin: ["north", "south"] };

describe("accountChangeRefusal", () => {
  it("lets an administrator of every one of the person's sites change them", () => {
    expect(accountChangeRefusal({ ...base, target: { siteIds: ["north"], role: "clinician", active: true }, after: { role: "reviewer", active: true } })).toBeNull();
  });

  it("refuses when the person also works at a site the administrator does not administer", () => {
    expect(accountChangeRefusal({ ...base, adminSiteIds: ["north"], target: { siteIds: ["north", "east"], role: "clinician", active: true }, after: { role: "clinician", active: false } }))
      .toEqual({ code: "forbidden", siteIds: ["east"] });
  });

  it("refuses to demote or deactivate the last active administrator of any of their sites", () => {
    const target = { siteIds: ["north", "south"], role: "admin" as const, active: true };
    const onlySouthCovered = { ...base, sitesWithAnotherAdmin: ["south"] };
    expect(accountChangeRefusal({ ...onlySouthCovered, target, after: { role: "clinician", active: true } })).toEqual({ code: "conflict", siteIds: ["north"] });
    expect(accountChangeRefusal({ ...onlySouthCovered, target, after: { role: "admin", active: false } })).toEqual({ code: "conflict", siteIds: ["north"] });
    expect(accountChangeRefusal({ ...base, target, after: { role: "clinician", active: true } })).toBeNull();
  });

  it("never stands in the way of reactivating or promoting", () => {
    expect(accountChangeRefusal({ ...base, sitesWithAnotherAdmin: [], target: { siteIds: ["north"], role: "admin", active: false }, after: { role: "admin", active: true } })).toBeNull();
  });
});
