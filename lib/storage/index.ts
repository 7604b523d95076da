export * from "./s3";
