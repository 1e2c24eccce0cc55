/** Firm settings and member forms: one zod schema each, used by the form and again by the server. */
import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";
import { CONTROL_CHARACTER_MESSAGE, isCleanLine } from "./text";

/** ISO 4217 codes Ballast accepts as a reporting currency (the currencies a small firm is likely to report in). */
export const REPORTING_CURRENCIES = ["EUR", "GBP", "USD", "CHF", "SEK", "NOK", "DKK", "PLN", "CZK", "JPY", "CAD", "AUD", "SGD", "HKD"] as const;

export const firmSettingsSchema = z.object({
  name: z.string().trim().min(2, "Enter the firm's name (at least 2 characters).").max(120, "At most 120 characters.").refine(isCleanLine, CONTROL_CHARACTER_MESSAGE),
  reportingCurrency: z.enum(REPORTING_CURRENCIES, { message: "Choose a reporting currency from the list." }),
  regulatorName: z.string().trim().max(160, "At most 160 characters.").refine(isCleanLine, CONTROL_CHARACTER_MESSAGE),
  licenceLabel: z.string().trim().min(2, "Name the signer's reference, e.g. \"Registration no.\"").max(60, "At most 60 characters.").refine(isCleanLine, CONTROL_CHARACTER_MESSAGE),
  methodCoApproval: z.boolean(),
  /** why the firm lets one person approve its method statement; required when methodCoApproval is off */
  methodSingleApprovalReason: z.string().trim().max(500, "At most 500 characters.").optional().default(""),
  deadlineRule: z.enum(["business-days-after", "fixed-day-next-month"], { message: "Choose a deadline rule." }),
  deadlineValue: z.coerce
    .number({ message: "Enter a whole number." })
    .int("Enter a whole number.")
    .min(1, "Between 1 and 60.")
    .max(60, "Between 1 and 60."),
}).superRefine((value, ctx) => {
  if (!value.methodCoApproval && (value.methodSingleApprovalReason ?? "").length < 10) {
    ctx.addIssue({ code: "custom", path: ["methodSingleApprovalReason"], message: "Say why one person may approve the method statement (at least 10 characters), or keep the co-approval." });
  }
  if (value.deadlineRule === "fixed-day-next-month" && value.deadlineValue > 31) {
    ctx.addIssue({ code: "custom", path: ["deadlineValue"], message: "A day of the month is between 1 and 31." });
  }
});
export type FirmSettingsInput = z.infer<typeof firmSettingsSchema>;

const rolesField = z
  .array(z.enum(ROLES, { message: "Unknown role." }))
  .min(1, "Give at least one role.")
  .refine((roles) => new Set(roles).size === roles.length, "Each role once.");

export const newMemberSchema = z.object({
  name: z.string().trim().min(2, "Enter the person's name.").max(120, "At most 120 characters.").refine(isCleanLine, CONTROL_CHARACTER_MESSAGE),
  email: z.string().trim().toLowerCase().email("Enter a valid e-mail address.").max(200, "At most 200 characters."),
  roles: rolesField,
});
/** An invitation: the person chooses their own password through the e-mailed link (administrators never set it). */
export type NewMemberInput = z.infer<typeof newMemberSchema>;

export const memberUpdateSchema = z
  .object({
    roles: rolesField.optional(),
    active: z.boolean().optional(),
  })
  .refine((v) => v.roles !== undefined || v.active !== undefined, "Send roles, active, or both.");
export type MemberUpdateInput = z.infer<typeof memberUpdateSchema>;

/** A route's `[name]` segment as a UUID, typed by its name (so that `params.periodId` is a string without a cast). */
export function idParam<K extends string>(name: K) {
  return z.object({ [name]: z.string().uuid() } as { [P in K]: z.ZodString });
}
