import { z } from "zod";

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter the e-mail address of your account.").max(254),
  password: z.string().min(1, "Enter your password.").max(256, "That password is too long."),
});
export type SignInInput = z.infer<typeof signInSchema>;
