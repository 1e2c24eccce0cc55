/**
 * The draft filing of a reporting period and its review and sign-off.
 *
 * Assembling: the period's marked filing run (completed), its method statement version, its data-quality report and
 * the firm's profile become one FilingViewModel (reports/view-model.ts), stored as the filing's content. While a
 * version is a draft (or sent back with changes requested) the compliance officer edits the cover note and the
 * explanation of each backtest exception, and the content is rebuilt from the same run.
 *
 * States: draft → in_review → changes_requested → in_review … → signed → filed. A signed version is locked by
 * SQLite triggers (db/migrations/0007_filings_locked.sql): a later change is a new version pointing at it, with a
 * reason, and the old signature is marked superseded (the old version's status becomes "superseded").
 *
 * Signing: the compliance head role; not the preparer, the submitter or the person who started the run (four eyes);
 * the signer's password entered again (a wrong one is refused, audited and rate-limited like sign-in); the
 * attestation ticked with the signer's name and licence or registration reference. The signature stores the
 * SHA-256 of the content's canonical form (reports/canonical.ts), recomputed by `verifyFiling`.
 *
 * Every function takes the Actor first and reads only the actor's firm; every write is one transaction with its
 * audit record.
 */
export { packFileName } from "@/reports/file-names";
export type { FilingRowStatus, PersonRef, SignatureView, CommentView, ExceptionView, FilingDetail, FilingVersionSummary, PeriodFiling, VerifyResult, PackFile } from "./filings/types";
export { FILING_ROW_STATUS_LABELS, attestationText } from "./filings/types";
export { getFiling, listFilingVersions, periodFiling, currentFilingPeriodId } from "./filings/read";
export { prepareFiling, updateFiling, submitFiling, commentOnFiling, replyOnFiling, requestChanges } from "./filings/workflow";
export { fourEyesNote, signFiling, newFilingVersion, markFiled, verifyFiling } from "./filings/sign";
export { packSource, downloadPack } from "./filings/packs";
