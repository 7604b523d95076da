export * from "./clock";
export * from "./conventions";
export * from "./arcs";
export * from "./zones";
