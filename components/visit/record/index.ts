export { VisitRecordPanels } from "./visit-record-panels";
