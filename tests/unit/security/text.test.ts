import { describe, expect, it } from "vitest";
import { isCleanLine, isCleanText } from "@/lib/validation/text";
import { signFilingSchema, markFiledSchema, filingCommentSchema } from "@/lib/validation/filings";
import { holidaySchema } from "@/lib/calendar/validation";
import { firmSettingsSchema, newMemberSchema } from "@/lib/validation/firm";

const HOSTILE = ["FMA\u0000-1", "FMA-\u202E1922", "A\u2066B\u2069", "zero\u200Bwidth", "esc\u001b[31m", "line\u2028sep", "bom\uFEFF", "del\u007f", "c1\u0085"];

describe("control and direction characters", () => {
  it.each(HOSTILE)("refuses %j in a line and in text", (value) => {
    expect(isCleanLine(value)).toBe(false);
    expect(isCleanText(value)).toBe(false);
  });

  it("allows ordinary text, accents, other scripts, and line breaks only in multi-line text", () => {
    for (const value of ["Helen Marsh", "Zoë Ødegård", "Müller & Söhne", "مرحبا", "名前", "FMA-CH-2291"]) expect(isCleanLine(value)).toBe(true);
    expect(isCleanLine("two\nlines")).toBe(false);
    expect(isCleanText("two\nlines\r\n\tindented")).toBe(true);
  });

  it("the signing, filing, comment, holiday, firm and member schemas refuse them naming the field", () => {
    const sign = signFilingSchema.safeParse({ password: "x", attest: true, signerName: "Helen Marsh", licenceReference: "FMA\u0000-\u202E1922" });
    expect(sign.success).toBe(false);
    expect(sign.error?.issues.map((i) => i.path.join("."))).toContain("licenceReference");
    const signer = signFilingSchema.safeParse({ password: "x", attest: true, signerName: "Helen\u202EMarsh", licenceReference: "FMA-1" });
    expect(signer.error?.issues.map((i) => i.path.join("."))).toContain("signerName");
    const filed = markFiledSchema.safeParse({ filedOn: "2026-12-01", reference: "REF\u0000" });
    expect(filed.error?.issues.map((i) => i.path.join("."))).toContain("reference");
    const comment = filingCommentSchema.safeParse({ section: "general", body: "Looks fine\u202E" });
    expect(comment.error?.issues.map((i) => i.path.join("."))).toContain("body");
    const holiday = holidaySchema.safeParse({ date: "2026-12-24", name: "Eve\u0000" });
    expect(holiday.error?.issues.map((i) => i.path.join("."))).toContain("name");
    const member = newMemberSchema.safeParse({ name: "Mallory\u202E", email: "m@x.example", roles: ["auditor"] });
    expect(member.error?.issues.map((i) => i.path.join("."))).toContain("name");
    const firm = firmSettingsSchema.safeParse({ name: "Northmoor\u0000", reportingCurrency: "EUR", regulatorName: "", licenceLabel: "Reg no.", methodCoApproval: false, deadlineRule: "business-days-after", deadlineValue: 15 });
    expect(firm.error?.issues.map((i) => i.path.join("."))).toContain("name");
  });
});
