import { describe, expect, it } from "vitest";
import { demoRefusal } from "./demo-accounts";

// The rule is ours (a published password must not guard patient data); the cases are its edges.
describe("demoRefusal", () => {
  it("refuses a production server whose database holds demo accounts", () => {
    expect(demoRefusal({ NODE_ENV: "production" }, 6)).toMatch(/6 demo accounts/);
    expect(demoRefusal({ NODE_ENV: "production" }, 1)).toMatch(/1 demo account whose/);
  });
  it("serves a database without them, a development server, and a declared demonstration install", () => {
    expect(demoRefusal({ NODE_ENV: "production" }, 0)).toBeNull();
    expect(demoRefusal({ NODE_ENV: "development" }, 6)).toBeNull();
    expect(demoRefusal({ NODE_ENV: "production", DENTATE_DEMO: "1" }, 6)).toBeNull();
    expect(demoRefusal({ NODE_ENV: "production", DENTATE_DEMO: "0" }, 6)).not.toBeNull();
  });
});
