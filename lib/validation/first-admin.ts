import { z } from "zod";
import { text } from "@/lib/validation/text";

/** The first administrator's command: who, and the clinic site they start with. */
export const firstAdminSchema = z.object({
  email: text().trim().toLowerCase().email("Give the administrator's e-mail address."),
  site: text().trim().min(2, "Name the clinic site (at least 2 characters).").max(120, "Keep the site name under 120 characters."),
  siteCode: text()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z0-9]{2,8}$/, "A site code is 2 to 8 letters or digits.")
    .optional(),
});
export type FirstAdminInput = z.infer<typeof firstAdminSchema>;

/** A short code from the site's name when none is given: the initials, else the first letters. */
export function siteCodeFrom(name: string): string {
  const words = name.toUpperCase().replace(/['’]/g, "").replace(/[^A-Z0-9 ]/g, " ").split(/\s+/).filter(Boolean);
  const initials = words.map((w) => w[0]).join("");
  const code = initials.length >= 2 ? initials : (words[0] ?? "SITE").slice(0, 3);
  return code.slice(0, 8).padEnd(2, "X");
}
