/** The filing requests' schemas: what they refuse, with which message, and the section list the forms offer. */
import { describe, expect, it } from "vitest";
import { FILING_SECTIONS, markFiledSchema, newFilingVersionSchema, prepareFilingSchema, requestChangesSchema, signFilingSchema, updateFilingSchema, filingCommentSchema } from "@/lib/validation/filings";
import { MAIN_SECTIONS } from "@/reports/sections";
import { packFileName } from "@/lib/data/filings";

const firstMessage = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  result.success ? null : result.error!.issues.map((i) => `${i.path.join(".")}: ${i.message}`);

describe("sections", () => {
  it("offers the filing's main sections in their order, after the filing as a whole", () => {
    expect(FILING_SECTIONS.map((s) => s.id)).toEqual(["general", ...MAIN_SECTIONS]);
  });
});

describe("schemas", () => {
  it("sign: needs the box ticked, a password, a name and a reference", () => {
    expect(firstMessage(signFilingSchema.safeParse({ password: "", attest: false, signerName: "", licenceReference: "" }))).toEqual([
      "password: Enter your password.",
      "attest: Tick the attestation to sign.",
      "signerName: Type your full name.",
      "licenceReference: Enter your licence or registration reference.",
    ]);
    expect(signFilingSchema.safeParse({ password: "x", attest: true, signerName: "Helen Marsh", licenceReference: "AB-1" }).success).toBe(true);
    // the attestation is a ticked box: neither "yes" nor a missing box passes, with the same message
    expect(firstMessage(signFilingSchema.safeParse({ password: "x", attest: "yes", signerName: "Helen Marsh", licenceReference: "AB-1" }))).toEqual(["attest: Tick the attestation to sign."]);
    expect(firstMessage(signFilingSchema.safeParse({ password: "x", signerName: "Helen Marsh", licenceReference: "AB-1" }))).toEqual(["attest: Tick the attestation to sign."]);
    expect(firstMessage(signFilingSchema.safeParse({ password: "x", attest: true, signerName: "Helen Marsh", licenceReference: "AB-1", extra: 1 }))).toHaveLength(1);
  });

  it("request changes and new version: a reason of some substance", () => {
    expect(firstMessage(requestChangesSchema.safeParse({ reason: " ok " }))).toEqual(["reason: Say what needs to change (at least 5 characters)."]);
    expect(requestChangesSchema.parse({ reason: "Explain the exceptions." }).section).toBe("general");
    expect(firstMessage(newFilingVersionSchema.safeParse({ reason: "" }))).toEqual(["reason: Say why the signed version needs to change (at least 5 characters)."]);
  });

  it("comments: a known section and a body", () => {
    expect(firstMessage(filingCommentSchema.safeParse({ section: "elsewhere", body: "" }))).toEqual(["section: Choose the section the comment is about.", "body: Write the comment."]);
  });

  it("edits: explanations keyed by real dates, something to change", () => {
    expect(firstMessage(updateFilingSchema.safeParse({}))).toEqual([": Send a cover note, explanations, or both."]);
    expect(updateFilingSchema.safeParse({ explanations: { "2026-02-30": "x" } }).success).toBe(false);
    expect(updateFilingSchema.safeParse({ explanations: { "2026-11-03": "A gap in bond prices." } }).success).toBe(true);
    expect(prepareFilingSchema.safeParse({ coverNote: 5 }).success).toBe(false);
  });

  it("filed: a real date and a reference", () => {
    expect(firstMessage(markFiledSchema.safeParse({ filedOn: "2026-02-30", reference: "" }))).toEqual(["filedOn: That date does not exist.", "reference: Enter the regulator's reference."]);
  });
});

describe("pack file names", () => {
  it("carry the firm, the period, the version and the state", () => {
    expect(packFileName("northmoor", "2026-11-30", 2, "in_review", "docx")).toBe("northmoor-2026-11-v2-draft.docx");
    expect(packFileName("northmoor", "2026-11-30", 1, "superseded", "xlsx")).toBe("northmoor-2026-11-v1-superseded.xlsx");
    expect(packFileName("pellam", "2026-10-31", 3, "filed", "xlsx")).toBe("pellam-2026-10-v3-filed.xlsx");
  });
});
