/**
 * The draft filing's requests: one zod schema each, used by the filing page's forms and again by the route handlers.
 * Client-safe (no server imports): the section list is kept here, in the order of the filing (it matches
 * reports/sections.ts, checked by tests/unit/filings/validation.test.ts).
 */
import { CONTROL_CHARACTER_MESSAGE, isCleanLine, isCleanText } from "./text";
import { realDate } from "./dates";
import { z } from "zod";

/** The sections a review comment can be about, in the filing's order, with "general" for the filing as a whole. */
export const FILING_SECTIONS = [
  { id: "general", label: "The filing as a whole" },
  { id: "cover", label: "Cover and cover note" },
  { id: "regulatory-capital", label: "Capital filed" },
  { id: "capital", label: "Capital summary" },
  { id: "var-es", label: "Value-at-risk and expected shortfall" },
  { id: "stressed", label: "Stressed value-at-risk" },
  { id: "backtest", label: "Backtest and exceptions" },
  { id: "method", label: "Method statement and rationale" },
  { id: "limitations", label: "Limitations" },
  { id: "data-quality", label: "Data quality" },
  { id: "changes", label: "Changes since the last filing" },
  { id: "sign-off", label: "Sign-off" },
  { id: "cautions", label: "Cautions" },
] as const;
export type FilingSectionId = (typeof FILING_SECTIONS)[number]["id"];
const SECTION_IDS = FILING_SECTIONS.map((s) => s.id) as [FilingSectionId, ...FilingSectionId[]];
export const sectionLabel = (id: string): string => FILING_SECTIONS.find((s) => s.id === id)?.label ?? id;

const MAX_NOTE = 20_000;
const MAX_EXPLANATION = 4_000;

const isoDate = realDate(2000, 2099);

/** POST /api/periods/[periodId]/filing: assemble the draft from the period's marked run (or rebuild an open draft). */
export const prepareFilingSchema = z
  .object({
    coverNote: z.string({ message: "The cover note is text." }).max(MAX_NOTE, "At most 20,000 characters.").refine(isCleanText, CONTROL_CHARACTER_MESSAGE).optional(),
  })
  .strict();
export type PrepareFilingInput = z.infer<typeof prepareFilingSchema>;

/** PATCH /api/filings/[filingId]: the compliance officer's cover note and explanations, while the filing is a draft. */
export const updateFilingSchema = z
  .object({
    coverNote: z.string({ message: "The cover note is text." }).max(MAX_NOTE, "At most 20,000 characters.").refine(isCleanText, CONTROL_CHARACTER_MESSAGE).optional(),
    /** explanation by exception date; "" removes an explanation */
    explanations: z
      .record(
        isoDate,
        z.string({ message: "An explanation is text." }).max(MAX_EXPLANATION, "At most 4,000 characters.").refine(isCleanText, CONTROL_CHARACTER_MESSAGE),
        { message: "Explanations by exception date (yyyy-mm-dd)." },
      )
      .optional(),
  })
  .strict()
  .refine((v) => v.coverNote !== undefined || v.explanations !== undefined, "Send a cover note, explanations, or both.");
export type UpdateFilingInput = z.infer<typeof updateFilingSchema>;

/** POST /api/filings/[filingId]/submit: send the draft to review, with an optional answer to the reviewer. */
export const submitFilingSchema = z
  .object({
    note: z.string({ message: "The note is text." }).trim().max(MAX_EXPLANATION, "At most 4,000 characters.").refine(isCleanText, CONTROL_CHARACTER_MESSAGE).default(""),
  })
  .strict();
export type SubmitFilingInput = z.infer<typeof submitFilingSchema>;

const commentBody = z.string({ message: "The comment is text." }).trim().min(2, "Write the comment.").max(MAX_EXPLANATION, "At most 4,000 characters.").refine(isCleanText, CONTROL_CHARACTER_MESSAGE);

/** POST /api/filings/[filingId]/comments (compliance head) and /replies (compliance officer): a note on one section. */
export const filingCommentSchema = z
  .object({
    section: z.enum(SECTION_IDS, { message: "Choose the section the comment is about." }),
    body: commentBody,
  })
  .strict();
export type FilingCommentInput = z.infer<typeof filingCommentSchema>;

/** POST /api/filings/[filingId]/request-changes: back to the compliance officer, with the reason. */
export const requestChangesSchema = z
  .object({
    section: z.enum(SECTION_IDS, { message: "Choose the section the change is about." }).default("general"),
    reason: z.string({ message: "The reason is text." }).trim().min(5, "Say what needs to change (at least 5 characters).").max(MAX_EXPLANATION, "At most 4,000 characters.").refine(isCleanText, CONTROL_CHARACTER_MESSAGE),
  })
  .strict();
export type RequestChangesInput = z.infer<typeof requestChangesSchema>;

/** POST /api/filings/[filingId]/sign: the compliance head's password again, the attestation, name and reference. */
export const signFilingSchema = z
  .object({
    password: z.string({ message: "Enter your password." }).min(1, "Enter your password.").max(200, "At most 200 characters."),
    // a boolean that must be ticked (not a literal `true`, so that the form can start unticked without a cast)
    attest: z.boolean({ message: "Tick the attestation to sign." }).refine((ticked) => ticked, "Tick the attestation to sign."),
    signerName: z.string({ message: "Type your name." }).trim().min(2, "Type your full name.").max(120, "At most 120 characters.").refine(isCleanLine, CONTROL_CHARACTER_MESSAGE),
    licenceReference: z.string({ message: "Enter your reference." }).trim().min(2, "Enter your licence or registration reference.").max(80, "At most 80 characters.").refine(isCleanLine, CONTROL_CHARACTER_MESSAGE),
  })
  .strict();
export type SignFilingInput = z.infer<typeof signFilingSchema>;

/** POST /api/filings/[filingId]/versions: a change after signing starts a new version, with the reason. */
export const newFilingVersionSchema = z
  .object({
    reason: z.string({ message: "The reason is text." }).trim().min(5, "Say why the signed version needs to change (at least 5 characters).").max(2000, "At most 2,000 characters.").refine(isCleanText, CONTROL_CHARACTER_MESSAGE),
  })
  .strict();
export type NewFilingVersionInput = z.infer<typeof newFilingVersionSchema>;

/** POST /api/filings/[filingId]/filed: the date it was filed with the regulator and the regulator's reference. */
export const markFiledSchema = z
  .object({
    filedOn: isoDate,
    reference: z.string({ message: "Enter the regulator's reference." }).trim().min(1, "Enter the regulator's reference.").max(100, "At most 100 characters.").refine(isCleanLine, CONTROL_CHARACTER_MESSAGE),
  })
  .strict();
export type MarkFiledInput = z.infer<typeof markFiledSchema>;

/** The two filing packs and how they are served. */
export const PACK_KINDS = {
  docx: { contentType: "application/vnd.openxmlformats-officedocument.wordprocessingml.document", label: "Word" },
  xlsx: { contentType: "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet", label: "spreadsheet" },
} as const;
export type PackKind = keyof typeof PACK_KINDS;
