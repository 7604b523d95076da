import { z } from "zod";
import { text } from "@/lib/validation/text";

/** True for a time zone name this runtime knows (IANA names such as America/Chicago). */
export function isTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat("en-US", { timeZone: name });
    return /^[A-Za-z_]+(\/[A-Za-z0-9_+-]+)*$/.test(name);
  } catch {
    return false;
  }
}

const name = text().trim().min(2, "Name the site (at least 2 characters).").max(120, "Keep the site name under 120 characters.");
const code = text()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9]{2,8}$/, "A site code is 2 to 8 letters or digits.");
const timeZone = text().trim().refine(isTimeZone, "Choose a time zone such as America/New_York or Europe/London.");
// A US ZIP is 5 digits; other countries' codes are letters, digits, spaces and dashes.
const postalCode = text()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9 -]{1,8}[A-Z0-9]$/, "Give the clinic's postal code, e.g. 60614 or SW1A 1AA.")
  .nullable()
  .optional()
  .or(z.literal("").transform(() => null));

/** One schema for the site form and its routes. */
export const siteSchema = z.object({ name, code, timeZone, postalCode });
export type SiteInput = z.infer<typeof siteSchema>;

export const siteUpdateSchema = siteSchema.partial().extend({ version: z.number({ message: "The form is out of date: reload it." }).int().min(1) });
export type SiteUpdateInput = z.infer<typeof siteUpdateSchema>;

export const userSitesSchema = z.object({
  siteIds: z.array(text().uuid("Not a site.")).min(1, "Everyone works at one site at least.").max(50, "Too many sites."),
});
