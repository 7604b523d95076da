import "server-only";
// Fixed-window counters kept in PostgreSQL, so every app process shares them.
export { hitRateLimit, releaseRateLimit, resetRateLimit } from "@/db/queries/users";
