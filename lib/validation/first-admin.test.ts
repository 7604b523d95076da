import { describe, expect, it } from "vitest";
import { firstAdminSchema, siteCodeFrom } from "./first-admin";

describe("first administrator input", () => {
  it("derives a site code from the name's initials, or its first letters", () => {
    expect(siteCodeFrom("Riverside Anal Health Clinic")).toBe("RAHC");
    expect(siteCodeFrom("Northgate")).toBe("NOR");
    expect(siteCodeFrom("St. Brendan's Colorectal Unit")).toBe("SBCU");
  });
  it("refuses a missing address and a malformed code with field messages", () => {
    const r = firstAdminSchema.safeParse({ email: "not-an-address", site: "Riverside", siteCode: "r-1" });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["email", "siteCode"]));
  });
});
