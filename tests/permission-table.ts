/**
 * The permission table every route handler must appear in: for each method and path, who may use it.
 * `tests/unit/permission-table-coverage.test.ts` fails when a route exists without an entry here;
 * `tests/e2e/permissions.spec.ts` calls every entry as each persona and checks the status.
 *
 * allowed: "public" (no sign-in), "member" (any role of the firm), or the roles that may.
 * invalidBody / validBody: for writes, a body that fails validation (an allowed role then gets 422, proving it
 * passed the gate without writing) and one that would pass (used only for the other firm, which must get 404).
 */
import type { Role } from "@/lib/auth/roles";

export interface RouteCase {
  method: "GET" | "POST" | "PATCH" | "PUT" | "DELETE";
  /** path with :params, as in the app/api folder names */
  path: string;
  allowed: "public" | "member" | readonly Role[];
  /** whether the route names a record of the firm (the other firm then gets 404) */
  scoped?: boolean;
  invalidBody?: unknown;
  validBody?: unknown;
  /**
   * a route Auth.js owns (sign-in, session), or one that checks its own secret instead of a session (the reminder
   * scheduler: 401 for everyone without it); exercised by its own tests (sign-in, reminders), not the table
   */
  external?: boolean;
  /** the status an allowed persona gets when it differs from 200 / 422 (stated beside the entry) */
  probe?: number;
}

export const ROUTES: readonly RouteCase[] = [
  { method: "GET", path: "/api/auth/[...nextauth]", allowed: "public", external: true },
  { method: "POST", path: "/api/auth/[...nextauth]", allowed: "public", external: true },
  { method: "GET", path: "/api/health", allowed: "public" },
  { method: "GET", path: "/api/audit", allowed: ["admin", "auditor"] },
  { method: "GET", path: "/api/firm", allowed: "member" },
  { method: "PATCH", path: "/api/firm", allowed: ["admin"], invalidBody: { name: "" } },
  { method: "GET", path: "/api/capital-profile", allowed: "member" },
  { method: "POST", path: "/api/capital-profile", allowed: ["compliance_officer", "compliance_head"], invalidBody: { name: "", regimes: "sometimes" } },
  { method: "GET", path: "/api/members", allowed: ["admin"] },
  { method: "POST", path: "/api/members", allowed: ["admin"], invalidBody: { email: "not-an-address" } },
  // A new invitation takes an empty object; any field is refused (422) before anything is looked up.
  { method: "POST", path: "/api/members/[memberId]/invitation", allowed: ["admin"], scoped: true, invalidBody: { note: "x" }, validBody: {} },
  { method: "POST", path: "/api/account/password", allowed: "member", invalidBody: { currentPassword: "", newPassword: "short" } },
  // Public account routes: every caller, signed in or not, gets 422 for an invalid body (nothing is looked up).
  { method: "POST", path: "/api/account/reset", allowed: "public", invalidBody: { email: "not-an-address" } },
  { method: "POST", path: "/api/account/set-password", allowed: "public", invalidBody: { token: "", password: "short", confirm: "", purpose: "invite" } },
  { method: "POST", path: "/api/setup", allowed: "public", invalidBody: { firmName: "" } },
  {
    method: "PATCH",
    path: "/api/members/[memberId]",
    allowed: ["admin"],
    scoped: true,
    invalidBody: { roles: [] },
    validBody: { active: true },
  },
  { method: "GET", path: "/api/periods", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"] },
  { method: "POST", path: "/api/periods", allowed: ["compliance_officer", "admin"], invalidBody: { month: "2026-13" } },
  { method: "GET", path: "/api/periods/[periodId]", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"], scoped: true },
  // Withdrawing needs a reason; the other firm's period answers 404 (the seeded periods are not empty: 409 for the owner).
  { method: "DELETE", path: "/api/periods/[periodId]", allowed: ["compliance_officer", "admin"], scoped: true, invalidBody: { reason: 5 }, validBody: { reason: "Opened by mistake" } },
  { method: "GET", path: "/api/calendar", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"] },
  { method: "GET", path: "/api/calendar/ics", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"] },
  { method: "GET", path: "/api/calendar/settings", allowed: ["admin"] },
  { method: "PUT", path: "/api/calendar/settings", allowed: ["admin"], invalidBody: { reminderOffsets: [61], remindOverdue: true, autoOpenPeriods: true } },
  { method: "GET", path: "/api/calendar/preferences", allowed: "member" },
  { method: "PUT", path: "/api/calendar/preferences", allowed: "member", invalidBody: { remindersEnabled: "sometimes" } },
  { method: "GET", path: "/api/calendar/reminders", allowed: ["admin"] },
  { method: "GET", path: "/api/holidays", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"] },
  { method: "PUT", path: "/api/holidays", allowed: ["admin"], invalidBody: { holidays: [{ date: "2026-02-30", name: "" }] } },
  { method: "POST", path: "/api/holidays/import", allowed: ["admin"], invalidBody: { csv: "" } },
  // Checks its own secret (REMINDERS_SECRET), not a session: tests/e2e/reminders.spec.ts calls it as every persona.
  { method: "POST", path: "/api/cron/reminders", allowed: "public", external: true },
  { method: "GET", path: "/api/mail/messages", allowed: ["admin"] },
  { method: "GET", path: "/api/uploads", allowed: "member" },
  { method: "GET", path: "/api/uploads/[uploadId]", allowed: "member", scoped: true },
  // The seeded upload is confirmed; parsed rows are served only while an upload waits for confirmation.
  { method: "GET", path: "/api/uploads/[uploadId]/rows", allowed: "member", scoped: true, probe: 409 },
  { method: "POST", path: "/api/uploads/positions/[uploadId]/confirm", allowed: ["compliance_officer"], scoped: true, invalidBody: { acknowledgeWarnings: "yes" }, validBody: { acknowledgeWarnings: true } },
  { method: "POST", path: "/api/uploads/positions/[uploadId]/cancel", allowed: ["compliance_officer"], scoped: true, invalidBody: { reason: 1 }, validBody: {} },
  { method: "PUT", path: "/api/uploads/positions/[uploadId]/options", allowed: ["compliance_officer"], scoped: true, invalidBody: { numberFormat: "roman" }, validBody: { numberFormat: "plain" } },
  { method: "POST", path: "/api/uploads/prices/[uploadId]/confirm", allowed: ["risk_analyst"], scoped: true, invalidBody: { acknowledgeWarnings: "yes" }, validBody: { acknowledgeWarnings: true } },
  { method: "POST", path: "/api/uploads/prices/[uploadId]/cancel", allowed: ["risk_analyst"], scoped: true, invalidBody: { reason: 1 }, validBody: {} },
  { method: "PUT", path: "/api/uploads/prices/[uploadId]/options", allowed: ["risk_analyst"], scoped: true, invalidBody: { numberFormat: "roman" }, validBody: { numberFormat: "plain" } },
  // The upload service's endpoints: its middleware runs the gate per upload route; exercised by tests/e2e/uploads.spec.ts.
  { method: "GET", path: "/api/uploadthing", allowed: "public", external: true },
  { method: "POST", path: "/api/uploadthing", allowed: "public", external: true },
  { method: "GET", path: "/api/templates/[template]", allowed: "member", probe: 200 },
  { method: "GET", path: "/api/periods/[periodId]/data-quality", allowed: "member", scoped: true },
  { method: "POST", path: "/api/periods/[periodId]/data-quality/confirmations", allowed: ["risk_analyst", "compliance_officer"], scoped: true, invalidBody: { check: "extreme-return", instrument: "X", dates: [], reason: "" }, validBody: { check: "extreme-return", instrument: "X", dates: [], reason: "A real move on the day of a profit warning." } },
  { method: "GET", path: "/api/method", allowed: "member" },
  { method: "POST", path: "/api/method", allowed: ["risk_analyst"], invalidBody: { reason: 5 } },
  // Without from/to: the newest version against the one it was drawn from.
  { method: "GET", path: "/api/method/diff", allowed: "member" },
  { method: "GET", path: "/api/method/[methodId]", allowed: "member", scoped: true },
  {
    method: "PUT",
    path: "/api/method/[methodId]",
    allowed: ["risk_analyst"],
    scoped: true,
    invalidBody: { content: { defaultEstimator: { kind: "ewma", lambdaMode: "fixed", lambda: 1.2 } }, rationale: "", analystLimitations: [] },
    validBody: { content: { defaultEstimator: { kind: "ewma", lambdaMode: "fixed", lambda: 0.94 }, covariance: "ewma", covarianceLambda: 0.94, covarianceWindow: 250, varMethod: "parametric", distribution: "normal", confidences: [0.99], horizonDays: 10, scaling: "sqrt", historicalWindow: 500, stressWindow: { mode: "search" }, minHistory: 250 }, rationale: "A rationale of more than twenty characters.", analystLimitations: [], reason: "" },
  },
  { method: "POST", path: "/api/method/[methodId]/approve", allowed: ["risk_analyst", "compliance_head"], scoped: true, invalidBody: { note: 5 }, validBody: {} },
  { method: "POST", path: "/api/method/[methodId]/evidence", allowed: ["risk_analyst"], scoped: true, invalidBody: { periodId: 5 }, validBody: {} },
  { method: "POST", path: "/api/method/[methodId]/discard", allowed: ["risk_analyst"], scoped: true, invalidBody: { reason: 5 }, validBody: {} },
  // Runs: read by everyone who reads periods; started, reproduced and chosen for the filing by risk analysts.
  // The [runId] is a completed run the permissions spec starts for the demo period before walking the table.
  { method: "GET", path: "/api/periods/[periodId]/runs", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"], scoped: true },
  { method: "POST", path: "/api/periods/[periodId]/runs", allowed: ["risk_analyst"], scoped: true, invalidBody: { excludeShortHistory: "yes" }, validBody: { excludeShortHistory: true } },
  { method: "GET", path: "/api/runs/[runId]", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"], scoped: true },
  { method: "GET", path: "/api/runs/[runId]/factors", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"], scoped: true },
  { method: "GET", path: "/api/runs/[runId]/volatility", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"], scoped: true },
  { method: "GET", path: "/api/runs/[runId]/change", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"], scoped: true },
  { method: "GET", path: "/api/runs/[runId]/inputs", allowed: ["admin", "compliance_officer", "risk_analyst", "compliance_head", "auditor"], scoped: true },
  { method: "POST", path: "/api/runs/[runId]/reproduce", allowed: ["risk_analyst"], scoped: true, invalidBody: { note: 5 }, validBody: {} },
  { method: "POST", path: "/api/runs/[runId]/use-for-filing", allowed: ["risk_analyst"], scoped: true, invalidBody: { confirm: "no" }, validBody: { confirm: true } },
  // Filings: read (and their packs downloaded) by every member; assembled, edited, submitted, answered and re-versioned
  // by compliance officers; commented on, sent back and signed by compliance heads; recorded as filed by compliance
  // officers. The [filingId] is the demo period's draft: the permissions spec marks its completed run for the filing
  // and has the compliance officer assemble the draft before walking the table (the seed holds no filing).
  { method: "GET", path: "/api/periods/[periodId]/filing", allowed: "member", scoped: true },
  { method: "POST", path: "/api/periods/[periodId]/filing", allowed: ["compliance_officer"], scoped: true, invalidBody: { coverNote: 5 }, validBody: {} },
  { method: "GET", path: "/api/filings/[filingId]", allowed: "member", scoped: true },
  { method: "PATCH", path: "/api/filings/[filingId]", allowed: ["compliance_officer"], scoped: true, invalidBody: { coverNote: 5 }, validBody: { coverNote: "A cover note." } },
  { method: "POST", path: "/api/filings/[filingId]/submit", allowed: ["compliance_officer"], scoped: true, invalidBody: { note: 5 }, validBody: {} },
  { method: "POST", path: "/api/filings/[filingId]/comments", allowed: ["compliance_head"], scoped: true, invalidBody: { section: "elsewhere", body: "" }, validBody: { section: "capital", body: "Check the multiplier." } },
  { method: "POST", path: "/api/filings/[filingId]/replies", allowed: ["compliance_officer"], scoped: true, invalidBody: { section: "elsewhere", body: "" }, validBody: { section: "capital", body: "Checked." } },
  { method: "POST", path: "/api/filings/[filingId]/request-changes", allowed: ["compliance_head"], scoped: true, invalidBody: { reason: "" }, validBody: { reason: "Explain the exceptions." } },
  {
    method: "POST",
    path: "/api/filings/[filingId]/sign",
    allowed: ["compliance_head"],
    scoped: true,
    invalidBody: { password: "", attest: false },
    validBody: { password: "not-the-password", attest: true, signerName: "Rafe Pellam", licenceReference: "REF-1" },
  },
  { method: "POST", path: "/api/filings/[filingId]/versions", allowed: ["compliance_officer"], scoped: true, invalidBody: { reason: "" }, validBody: { reason: "A correction to the cover note." } },
  { method: "POST", path: "/api/filings/[filingId]/filed", allowed: ["compliance_officer"], scoped: true, invalidBody: { filedOn: "2026-02-30", reference: "" }, validBody: { filedOn: "2026-12-01", reference: "REG-1" } },
  { method: "GET", path: "/api/filings/[filingId]/verify", allowed: "member", scoped: true },
  { method: "GET", path: "/api/filings/[filingId]/packs/docx", allowed: "member", scoped: true },
  { method: "GET", path: "/api/filings/[filingId]/packs/xlsx", allowed: "member", scoped: true },
];
