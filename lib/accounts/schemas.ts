// One schema per account form, shared by the pages and the routes.
import { z } from "zod";
import { text } from "@/lib/validation/text";
import { ROLES } from "@/lib/domain/vocab";
import { PASSWORD_MAX_CHARS } from "./password-rules";

const email = text().trim().toLowerCase().email("Enter a valid e-mail address.").max(254, "That address is too long.");
const token = text().regex(/^[A-Za-z0-9_-]{43}$/, "This link is not valid.");
const password = z.string().min(1, "Choose a password.").max(PASSWORD_MAX_CHARS, `Use at most ${PASSWORD_MAX_CHARS} characters.`);

export const inviteSchema = z.object({
  email,
  siteId: text().uuid("Choose a site."),
  role: z.enum(ROLES, { message: "Choose a role." }),
});
export type InviteInput = z.infer<typeof inviteSchema>;

export const acceptInviteSchema = z.object({
  token,
  displayName: text().trim().min(2, "Enter your name as colleagues should see it.").max(120, "Keep the name under 120 characters."),
  password,
});

export const forgotPasswordSchema = z.object({ email });

export const resetPasswordSchema = z.object({ token, password });

export const updateUserSchema = z
  .object({
    role: z.enum(ROLES, { message: "Choose a role." }).optional(),
    active: z.boolean({ message: "Active must be true or false." }).optional(),
  })
  .refine((v) => v.role !== undefined || v.active !== undefined, { message: "Nothing to change.", path: ["_"] });
