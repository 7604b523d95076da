// Builds the one patient row a research export may carry. It is written as an allow-list:
// fields are copied in by name, so a column added to the patient record later can never leak.
import type { RiskGroup } from "@/lib/domain/vocab";
import { HIV_STATUS, SEX_AT_BIRTH } from "@/lib/domain/vocab";
import type { DateInput } from "@/lib/dates/calendar";
import { ageCategory, reportableBirthYear, yearOnly, zip3, type DateMode } from "./safe-harbor";

export type SexAtBirth = (typeof SEX_AT_BIRTH)[number];
export type HivStatus = (typeof HIV_STATUS)[number];

/**
 * Field names of the patient record that hold Safe Harbor identifiers (45 CFR 164.514(b)(2)(i)):
 * names, sub-state geography, full dates, contact numbers, record and account numbers,
 * web and device identifiers, images, and free text that may hold any of these.
 */
export const FORBIDDEN_FIELDS = [
  "givenName", "familyName", "fullName", "mrn", "email", "phone", "fax", "ssn",
  "street", "city", "county", "zip", "dateOfBirth", "deathDate",
  "healthPlanNumber", "accountNumber", "licenceNumber", "vehicleId", "deviceId",
  "url", "ipAddress", "photo", "notes",
] as const;
export type ForbiddenField = (typeof FORBIDDEN_FIELDS)[number];

/** The identified record as the clinic holds it. Only the fields read below ever leave this function. */
export interface IdentifiedPatient {
  id: string;
  dateOfBirth: DateInput;
  sexAtBirth: SexAtBirth;
  hivStatus: HivStatus;
  riskGroups: readonly RiskGroup[];
  zip?: string | null;
  givenName?: string;
  familyName?: string;
  mrn?: string;
  email?: string;
  phone?: string;
  notes?: string;
  [other: string]: unknown;
}

export interface DeidentifyOptions {
  enrolmentDate: DateInput;
  studySubjectId: string;
  dateMode: DateMode;
  /**
   * The export date. A birth year that was fine at enrolment can point to an age over 89 later,
   * so the year is withheld when the patient is over 89 on either date.
   */
  asOfDate?: DateInput;
}

export interface DeidentifiedPatient {
  studySubjectId: string;
  /** null when the patient is over 89: the year alone would reveal the age. */
  birthYear: number | null;
  /** Age at enrolment, "90+" above 89. */
  ageCategory: string;
  sexAtBirth: SexAtBirth;
  hivStatus: HivStatus;
  riskGroups: RiskGroup[];
  zip3: string;
  dateMode: DateMode;
  /** Year of enrolment in year mode; null in offset mode, where enrolment is day 0. */
  enrolmentYear: number | null;
}

export function deidentifyPatient(record: IdentifiedPatient, options: DeidentifyOptions): DeidentifiedPatient {
  const { enrolmentDate, studySubjectId, dateMode } = options;
  if (!studySubjectId.trim()) throw new Error("studySubjectId is required");
  // A subject id built from the MRN or the record key would re-identify every row.
  for (const own of [record.mrn, record.id]) {
    if (own && studySubjectId.includes(own)) throw new Error("studySubjectId must not contain the MRN or record id");
  }
  const ageAtEnrolment = ageCategory(record.dateOfBirth, enrolmentDate);
  return {
    studySubjectId,
    birthYear: reportableBirthYear(record.dateOfBirth, enrolmentDate, options.asOfDate),
    ageCategory: ageAtEnrolment,
    sexAtBirth: record.sexAtBirth,
    hivStatus: record.hivStatus,
    riskGroups: [...record.riskGroups],
    zip3: zip3(record.zip),
    dateMode,
    enrolmentYear: dateMode === "year" ? yearOnly(enrolmentDate) : null,
  };
}
