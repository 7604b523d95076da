import { describe, expect, it } from "vitest";
import { fireEvent, render, screen } from "@testing-library/react";
import { ExportPanel } from "./export-panel";

const STUDY = "0b5d6c1e-2f3a-4b5c-8d6e-7f8091a2b3c4";

describe("export panel", () => {
  it("offers an identified export only as a POST form whose buttons wait for a meaningful reason", () => {
    const { container } = render(<ExportPanel studyId={STUDY} sites={[{ id: "s1", code: "HBR" }]} canIdentify />);
    expect(screen.getByRole("link", { name: /workbook/ }).getAttribute("href")).not.toContain("identified");
    fireEvent.click(screen.getByLabelText(/Identified export/));
    // No link can start it: the links are gone, a form posts instead.
    expect(screen.queryAllByRole("link")).toEqual([]);
    const form = container.querySelector("form")!;
    expect(form.getAttribute("method")).toBe("post");
    const reason = screen.getByLabelText(/Reason, kept in the audit log/);
    const submit = screen.getByRole("button", { name: /All three, identified/ });
    fireEvent.change(reason, { target: { value: ".........." } });
    expect((submit as HTMLButtonElement).disabled).toBe(true);
    fireEvent.change(reason, { target: { value: "Safety board asked for the follow-up letters" } });
    expect((submit as HTMLButtonElement).disabled).toBe(false);
    const fields = Object.fromEntries(new FormData(form).entries());
    expect(fields).toMatchObject({ studyId: STUDY, identified: "1", reason: "Safety board asked for the follow-up letters" });
  });
});
