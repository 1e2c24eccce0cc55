/** Sign-in and password rules, shared by the forms and the server. */
import { z } from "zod";

export const signInSchema = z.object({
  email: z.string().trim().min(1, "Enter your e-mail address.").email("Enter a valid e-mail address."),
  password: z.string().min(1, "Enter your password.").max(200, "That password is too long."),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const MIN_PASSWORD_LENGTH = 12;

/** A new password: long enough, not too long. Common-password screening is done on the server. */
export const newPasswordSchema = z
  .string()
  .min(MIN_PASSWORD_LENGTH, `Use at least ${MIN_PASSWORD_LENGTH} characters.`)
  .max(200, "Use at most 200 characters.");
