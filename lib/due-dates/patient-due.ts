import type { NextDue } from "./rules";

/** A patient's next due date as the worklist, the patient page and the reminders show it. */
export interface PatientDue extends NextDue {
  patientId: string;
  siteId: string;
  siteName: string;
  mrn: string;
  familyName: string;
  givenName: string;
  clinicianId: string | null;
  clinicianName: string | null;
  lastVisitDate: string;
  overdueDays: number;
  consentEmail: boolean;
  contactEmail: string | null;
}
