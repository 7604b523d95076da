import { afterEach, describe, expect, it, vi } from "vitest";
import { fireEvent, render, screen, waitFor } from "@testing-library/react";
import { PatientForm } from "./patient-form";

// The network is faked (fetch is the DOM boundary); what is checked is what the user sees and sends.
const push = vi.fn();
vi.mock("next/navigation", () => ({ useRouter: () => ({ push, refresh: vi.fn() }) }));

const SITE = { id: "6f1c2a8e-3b4d-4e5f-8a9b-0c1d2e3f4a5b", name: "Harbour Clinic" };
const reply = (status: number, body: unknown) => Promise.resolve(new Response(JSON.stringify(body), { status, headers: { "content-type": "application/json" } }));

afterEach(() => vi.unstubAllGlobals());

function fill() {
  const set = (label: string, value: string) => fireEvent.change(screen.getByLabelText(label, { exact: false }), { target: { value } });
  set("Family name", "Kowalczik");
  set("Given name", "Marta");
  set("Date of birth", "1972-08-14");
  set("Sex at birth", "female");
  set("Medical record number", "H-778");
}

describe("PatientForm", { timeout: 20_000 }, () => {
  it("shows a message under each missing field and sends nothing", async () => {
    const fetch = vi.fn();
    vi.stubGlobal("fetch", fetch);
    render(<PatientForm sites={[SITE]} clinicians={[]} />);
    fireEvent.click(screen.getByRole("button", { name: "Register patient" }));
    expect(await screen.findByText("Give the family name.")).toBeTruthy();
    expect(screen.getByText("Give the date of birth.")).toBeTruthy();
    expect(screen.getByText("Choose the sex at birth.")).toBeTruthy();
    expect(fetch).not.toHaveBeenCalled();
  });

  it("lists the look-alikes of a duplicate warning and registers only when the user confirms", async () => {
    const bodies: Record<string, unknown>[] = [];
    vi.stubGlobal("fetch", vi.fn((_url: string, init?: RequestInit) => {
      const body = JSON.parse(String(init?.body)) as Record<string, unknown>;
      bodies.push(body);
      if (!body.confirmDuplicate) {
        return reply(409, { error: { code: "possible_duplicate", message: "A patient born the same day is already registered here.", candidates: [
          { id: "p1", mrn: "H-001", familyName: "Kowalczyk", givenName: "Marta", dateOfBirth: "1972-08-14", href: "/patients/p1" },
        ] } });
      }
      return reply(201, { patient: { id: "p2" }, href: "/patients/p2" });
    }));
    render(<PatientForm sites={[SITE]} clinicians={[]} />);
    fill();
    fireEvent.click(screen.getByRole("button", { name: "Register patient" }));
    const link = await screen.findByRole("link", { name: "Kowalczyk, Marta" });
    expect(link.getAttribute("href")).toBe("/patients/p1");
    expect(push).not.toHaveBeenCalled();
    fireEvent.click(screen.getByRole("button", { name: "They are different people: register" }));
    await waitFor(() => expect(push).toHaveBeenCalledWith("/patients/p2"));
    expect(bodies.map((b) => b.confirmDuplicate)).toEqual([false, true]);
    expect(bodies[1]).toMatchObject({ siteId: SITE.id, familyName: "Kowalczik", dateOfBirth: "1972-08-14", riskGroups: [] });
  });
});
