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
  /**
   * A stored date the calendar cannot work with (e.g. a visit dated 9999-12-31, whose next day has
   * no ISO form): the row is listed, flagged, with its last visit date as the due date, so one bad
   * row never takes a list down and the staff can find and correct it.
   */
  dateProblem?: boolean;
}
