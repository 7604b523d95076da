import "server-only";
import { setDisplayConvention } from "@/db/queries/users";
import type { DisplayConvention } from "@/lib/geometry";

/** The user's clock numbering on screen (a view only: the stored frame never changes). */
export function saveDisplayConvention(userId: string, convention: DisplayConvention): Promise<void> {
  return setDisplayConvention(userId, convention);
}
