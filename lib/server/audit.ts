import "server-only";
// Pages and routes that read a patient record record the read here; services record their
// changes in the change's own transaction. Either way the row is written by db/queries/audit-write.ts.
export { recordAudit, type AuditInput } from "@/db/queries/audit-write";
