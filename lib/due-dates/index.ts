export * from "./rules";
export * from "./eligibility";
