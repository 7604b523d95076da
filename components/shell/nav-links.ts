import type { Role } from "@/lib/domain/vocab";

export interface NavLink {
  href: string;
  label: string;
}

/** Only what is built is linked. */
export function navLinksFor(role: Role): NavLink[] {
  switch (role) {
    case "clinician":
      return [
        { href: "/patients", label: "Patients" },
        { href: "/worklist", label: "Worklist" },
        { href: "/biopsies", label: "Biopsies" },
      ];
    case "reviewer":
      return [
        { href: "/reviews", label: "Reviews for me" },
        { href: "/patients", label: "Patients" },
        { href: "/worklist", label: "Worklist" },
        { href: "/quality", label: "Quality" },
      ];
    case "admin":
      return [
        { href: "/patients", label: "Patients" },
        { href: "/worklist", label: "Worklist" },
        { href: "/biopsies", label: "Biopsies" },
        { href: "/staff", label: "Staff" },
        { href: "/sites", label: "Sites" },
        { href: "/followup-rules", label: "Follow-up rules" },
        { href: "/audit", label: "Audit" },
        { href: "/studies", label: "Studies" },
        { href: "/quality", label: "Quality" },
      ];
    case "research_nurse":
      return [{ href: "/studies", label: "Studies" }];
  }
}

/** Where each role lands after sign-in. */
export function homeFor(role: Role): string {
  return role === "research_nurse" ? "/studies" : "/patients";
}
