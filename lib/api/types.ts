// Types of the API's JSON answers, one module for the server that produces them and the
// screens that read them. JSON turns Dates into strings: `Wire<T>` is T as the browser gets it.
import type { Adequacy, Cytology, HpvResult, Position, VisitStatus } from "@/lib/domain/vocab";
import type { TimelineDto } from "@/lib/timeline/assemble";

/** POST /api/patients/import/check answers an ImportReport; POST /api/patients/import streams ImportEvents. */
export type { ImportEvent, ImportReport, ImportResult } from "@/lib/patient-import/report";

export type Wire<T> = T extends Date ? string : T extends (infer U)[] ? Wire<U>[] : T extends object ? { [K in keyof T]: Wire<T[K]> } : T;

/** GET /api/patients/:id/timeline answers a TimelineWire (columns, lib/timeline/wire); screens read it decoded, as Timeline. */
export type Timeline = Wire<TimelineDto>;
export type { TimelineWire } from "@/lib/timeline/wire";

/** A visit's exam record as the server reads it (GET /api/visits/:id answers `Wire<VisitRecord>`). */
export interface VisitRecord {
  id: string;
  patientId: string;
  siteId: string;
  visitDate: string;
  status: VisitStatus;
  examinerId: string;
  examinerName: string;
  patientPosition: Position;
  indication: string | null;
  cytology: Cytology;
  hpvResult: HpvResult;
  adequacy: Adequacy | null;
  examStartedAt: Date | null;
  examEndedAt: Date | null;
  anaesthesia: string | null;
  patientWeightKg: number | null;
  plan: string | null;
  signedAt: Date | null;
  signedByName: string | null;
  version: number;
  updatedAt: Date;
  extentCautionFraction: number;
}
export type VisitRecordDto = Wire<VisitRecord>;
