export * from "./clock";
export * from "./clock-text";
export * from "./conventions";
export * from "./arcs";
export * from "./zones";
export * from "./coverage";
