export * from "./sniff";
export * from "./limits";
export * from "./object-keys";
export * from "./prepare";
export * from "./multipart";
