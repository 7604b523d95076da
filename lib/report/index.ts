export { renderVisitReport } from "./render";
export { buildReportModel, histologyText, type ReportModel, type Table } from "./model";
export type { VisitReportData, Paper } from "./types";
