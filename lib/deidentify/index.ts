export * from "./safe-harbor";
export * from "./deidentify-patient";
