export * from "./enums";
export * from "./accounts";
export * from "./clinical";
export * from "./research";
