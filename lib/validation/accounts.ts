/** Account forms: invitations, choosing a password through a link, reset requests, password change, first run. */
import { z } from "zod";
import { newPasswordSchema } from "./auth";
import { REPORTING_CURRENCIES, newMemberSchema } from "./firm";

const email = z.string().trim().toLowerCase().min(1, "Enter an e-mail address.").email("Enter a valid e-mail address.").max(200, "At most 200 characters.");
const personName = z.string().trim().min(2, "Enter the person's name (at least 2 characters).").max(120, "At most 120 characters.");

/**
 * A form that sets a new password: `shape`, the new password under `key` and the same typed again in `confirm`
 * (`differ` is the message on confirm when the two differ).
 */
function withNewPassword<S extends z.ZodRawShape, K extends string>(shape: S, key: K, differ: string) {
  const passwordFields = { [key]: newPasswordSchema, confirm: z.string() } as Record<K, typeof newPasswordSchema> & { confirm: z.ZodString };
  return z.object({ ...shape, ...passwordFields }).refine((v: Record<string, unknown>) => v[key] === v.confirm, { path: ["confirm"], message: differ });
}

export const inviteSchema = newMemberSchema;
export type InviteInput = z.infer<typeof inviteSchema>;

/** Choosing a password through a link: the new password typed twice. */
const linkToken = z.string().min(1, "The link is missing its token.").max(100, "The link is not valid.");
export const tokenPasswordSchema = withNewPassword({ token: linkToken }, "password", "The two passwords differ.");
export type TokenPasswordInput = z.infer<typeof tokenPasswordSchema>;

export const resetRequestSchema = z.object({ email });
export type ResetRequestInput = z.infer<typeof resetRequestSchema>;

const currentPassword = z.string().min(1, "Enter your current password.").max(200, "That password is too long.");
export const changePasswordSchema = withNewPassword({ currentPassword }, "newPassword", "The two new passwords differ.");
export type ChangePasswordInput = z.infer<typeof changePasswordSchema>;

export const firstRunSchema = withNewPassword(
  {
    firmName: z.string().trim().min(2, "Enter the firm's name (at least 2 characters).").max(120, "At most 120 characters."),
    reportingCurrency: z.enum(REPORTING_CURRENCIES, { message: "Choose a reporting currency from the list." }),
    adminName: personName,
    adminEmail: email,
  },
  "password",
  "The two passwords differ.",
);
export type FirstRunInput = z.infer<typeof firstRunSchema>;

/** `npm run firm:create` arguments. */
export const firmCreateArgsSchema = z.object({
  name: z.string().trim().min(2, "--name: the firm's name, at least 2 characters.").max(120, "--name: at most 120 characters."),
  currency: z.string().trim().toUpperCase().pipe(z.enum(REPORTING_CURRENCIES, { message: `--currency: one of ${REPORTING_CURRENCIES.join(", ")}.` })),
  adminEmail: z.string().trim().toLowerCase().email("--admin-email: a valid e-mail address."),
  adminName: z.string().trim().min(2, "--admin-name: at least 2 characters.").max(120, "--admin-name: at most 120 characters."),
});
