import { describe, expect, it } from "vitest";
import { render, screen } from "@testing-library/react";
import { Caution } from "./caution";

describe("Caution", () => {
  // A caution must reach a screen-reader user: a danger interrupts (alert), a caution waits its turn (status).
  it("announces a danger as an alert with its title and explanation", () => {
    render(<Caution tone="danger" title="Dose over the label maximum">Local protocol and the clinician decide.</Caution>);
    const alert = screen.getByRole("alert");
    expect(alert.textContent).toContain("Dose over the label maximum");
    expect(alert.textContent).toContain("clinician decide");
  });
  it("announces a caution politely as a status", () => {
    render(<Caution title="Half the circumference treated" />);
    expect(screen.getByRole("status").textContent).toContain("Half the circumference treated");
    expect(screen.queryByRole("alert")).toBeNull();
  });
});
