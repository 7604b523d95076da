import { describe, expect, it, vi } from "vitest";
import { render, screen } from "@testing-library/react";
import { DEFAULT_FOLLOWUP_MONTHS, FOLLOWUP_RULE_KEYS } from "@/lib/due-dates/rules";
import { RULE_WORDS } from "@/lib/due-dates/rule-words";
import { RulesForm } from "./rules-form";

vi.mock("next/navigation", () => ({ useRouter: () => ({ refresh: vi.fn() }) }));

// The rules exactly as the page builds them.
const rules = FOLLOWUP_RULE_KEYS.map((key) => ({ key, ...RULE_WORDS[key], defaultMonths: DEFAULT_FOLLOWUP_MONTHS[key] }));

describe("follow-up rules form", () => {
  it("never shows a note about where a default came from, and says plainly when no interval was published", () => {
    const { container } = render(<RulesForm siteId="s1" rules={rules} current={{}} />);
    expect(container.textContent).not.toMatch(/from memory|no source/i);
    // No single published interval was found for these (source notes in lib/due-dates/rules.ts).
    for (const title of ["Suspected or confirmed cancer", "Low-grade findings only", "Abnormal cytology, normal examination"]) {
      const row = screen.getByText(title).closest("tr")!;
      expect(row.textContent).toContain("Local default, no published interval; set per site");
    }
  });

  it("writes one month in the singular", () => {
    render(<RulesForm siteId="s1" rules={rules} current={{}} />);
    const row = screen.getByText("Suspected or confirmed cancer").closest("tr")!;
    expect(row.textContent).toContain("1 month · ");
    expect(row.textContent).not.toMatch(/1 months/);
  });
});
