import "server-only";
import { headers } from "next/headers";
import { AppError } from "@/lib/errors";
import { originAllowed } from "./request-info";

export const NOT_FROM_OUR_PAGE = "This request did not come from a Dentate page.";

/**
 * Server actions follow the route handlers' rule: the request must carry our own Origin. Next.js
 * compares a present Origin with the host itself but lets a request without one through. Call it
 * first in every action; it returns the request's headers for the rest of the action.
 */
export async function assertActionOrigin(): Promise<Headers> {
  const h = await headers();
  if (!originAllowed(h)) throw new AppError("forbidden", NOT_FROM_OUR_PAGE);
  return h;
}
