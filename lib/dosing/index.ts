export * from "./anaesthetic";
export * from "./extent";
