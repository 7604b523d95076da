import { describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen } from "@testing-library/react";
import { PatientForm } from "@/components/patient/patient-form";
import { NewVisitForm } from "@/components/patient/new-visit-form";

// Dates are typed as the app shows them (ISO 8601 calendar dates, yyyy-mm-dd), not in the order
// of the browser's locale: a text field the app controls, with the ISO pattern.
vi.mock("next/navigation", () => ({ useRouter: () => ({ push: vi.fn(), refresh: vi.fn() }) }));

function expectIsoField(input: HTMLInputElement) {
  expect(input.type).toBe("text");
  expect(input.placeholder).toBe("yyyy-mm-dd");
  const pattern = new RegExp(`^(?:${input.pattern})$`); // as the browser applies it (HTML, the pattern attribute)
  expect(pattern.test("2027-03-14")).toBe(true);
  for (const localeOrder of ["03/14/2027", "14.03.2027", "14/03/2027"]) expect(pattern.test(localeOrder)).toBe(false);
}

describe("date fields", () => {
  it("the date of birth is typed yyyy-mm-dd and kept as typed", () => {
    render(<PatientForm sites={[{ id: "6f1c2a8e-3b4d-4e5f-8a9b-0c1d2e3f4a5b", name: "Harbour Clinic" }]} clinicians={[]} />);
    const dob = screen.getByLabelText("Date of birth", { exact: false }) as HTMLInputElement;
    expectIsoField(dob);
    fireEvent.change(dob, { target: { value: "1972-08-14" } });
    expect(dob.value).toBe("1972-08-14");
  });

  it("a new visit's date is typed yyyy-mm-dd, starting from today's", () => {
    render(<NewVisitForm patientId="p1" today="2027-03-14" />);
    const date = screen.getByLabelText("Visit date", { exact: false }) as HTMLInputElement;
    expectIsoField(date);
    expect(date.value).toBe("2027-03-14");
  });
});
