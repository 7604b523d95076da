import { describe, expect, it } from "vitest";
import { z } from "zod";
import { siteRuleTableSchema } from "@/lib/due-dates/rules";
import { plainIssueMessage } from "./plain-words";

// As lib/http/route.ts parseWith parses every request body (the route test checks the wiring).
function fieldsOf(schema: z.ZodType, value: unknown): Record<string, string[]> {
  const r = schema.safeParse(value, { error: plainIssueMessage });
  if (r.success) throw new Error("accepted");
  const out: Record<string, string[]> = {};
  for (const i of r.error.issues) (out[i.path.join(".")] ??= []).push(i.message);
  return out;
}

describe("validation messages in plain words", () => {
  it("says what a follow-up interval must be, not the library's wording", () => {
    expect(fieldsOf(siteRuleTableSchema, { suspected_cancer: 0 })).toEqual({ suspected_cancer: ["Enter a number of at least 1."] });
    expect(fieldsOf(siteRuleTableSchema, { lsil_only: 37 })).toEqual({ lsil_only: ["Enter a number of at most 36."] });
    expect(fieldsOf(siteRuleTableSchema, { lsil_only: 1.5 })).toEqual({ lsil_only: ["Enter a whole number."] });
    expect(fieldsOf(siteRuleTableSchema, { lsil_only: "six" })).toEqual({ lsil_only: ["Enter a number."] });
  });

  it("keeps a schema's own message", () => {
    expect(fieldsOf(z.object({ n: z.number().min(1, "At least one month.") }), { n: 0 })).toEqual({ n: ["At least one month."] });
  });

  it("never passes the library's default wording through", () => {
    const s = z.object({ name: z.string().min(1), when: z.iso.date(), kind: z.enum(["a", "b"]) });
    const all = Object.values(fieldsOf(s, { name: "", when: "12/03/2026", kind: "c" })).flat();
    expect(all).toEqual(["Required.", "Use a date written YYYY-MM-DD.", "Choose one of the options."]);
    for (const m of all) expect(m).not.toMatch(/expected|Invalid input|Too small|>=/);
  });
});
