export * from "./icd10cm";
export * from "./last";
export * from "./suggest-codes";
