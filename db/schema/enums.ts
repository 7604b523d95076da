import { pgEnum } from "drizzle-orm/pg-core";
import * as v from "../../lib/domain/vocab";

export const roleEnum = pgEnum("role", v.ROLES);
export const positionEnum = pgEnum("patient_position", v.POSITIONS);
export const gradeEnum = pgEnum("grade", v.GRADES);
export const histologyEnum = pgEnum("histology", v.HISTOLOGY);
export const ainEnum = pgEnum("ain_grade", v.AIN_GRADES);
export const p16Enum = pgEnum("p16", v.P16);
export const cytologyEnum = pgEnum("cytology", v.CYTOLOGY);
export const hpvEnum = pgEnum("hpv_result", v.HPV_RESULTS);
export const adequacyEnum = pgEnum("adequacy", v.ADEQUACY);
export const morphologyEnum = pgEnum("morphology", v.MORPHOLOGY);
export const acetowhiteEnum = pgEnum("acetowhite", v.ACETOWHITE);
export const lugolEnum = pgEnum("lugol", v.LUGOL);
export const zoneEnum = pgEnum("zone", v.ZONES);
export const modalityEnum = pgEnum("modality", v.MODALITIES);
export const agentEnum = pgEnum("anaesthetic_agent", v.ANAESTHETIC_AGENTS);
export const trackStatusEnum = pgEnum("track_status", v.TRACK_STATUSES);
export const trackCheckEnum = pgEnum("track_check_outcome", v.TRACK_CHECK_OUTCOMES);
export const sexEnum = pgEnum("sex_at_birth", v.SEX_AT_BIRTH);
export const hivEnum = pgEnum("hiv_status", v.HIV_STATUS);
export const riskGroupEnum = pgEnum("risk_group", v.RISK_GROUPS);
export const patientStatusEnum = pgEnum("patient_status", v.PATIENT_STATUSES);
export const complicationEnum = pgEnum("complication_kind", v.COMPLICATION_KINDS);
export const severityEnum = pgEnum("severity", v.SEVERITIES);
export const visitStatusEnum = pgEnum("visit_status", v.VISIT_STATUSES);
export const attachmentKindEnum = pgEnum("attachment_kind", ["photo", "document"]);
export const reviewStatusEnum = pgEnum("review_status", ["requested", "in_progress", "signed_off"]);
// not_examined: the reviewer could not judge this track (images or notes do not show it).
export const verdictEnum = pgEnum("verdict", ["agree", "disagree", "not_examined"]);
// How a reviewer's disagreement was settled: the reviewer's proposed status accepted (the record was
// changed to match) or the recorded status kept.
export const disagreementOutcomeEnum = pgEnum("disagreement_outcome", v.DISAGREEMENT_OUTCOMES);
export const outboxStatusEnum = pgEnum("outbox_status", ["pending", "sent", "failed"]);
