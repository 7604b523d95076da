export * from "./types";
export * from "./terminology";
export * from "./uuid";
export * from "./body-structure";
export * from "./build-bundle";
