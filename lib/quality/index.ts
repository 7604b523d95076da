export * from "./metrics";
