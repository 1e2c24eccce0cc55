/** The filing's read and stored shapes (detail, versions, signatures, comments, packs), its locked and editable states and the attestation wording. */
import "server-only";
import { filings, reportingPeriods, signatures } from "@/db/schema";
import type { RunRecord } from "@/lib/runs/types";
import { FILING_STATUS_LABELS, type FilingStatus, type FilingViewModel, type SupersededSignature } from "@/reports/view-model";
import { fragment } from "@/reports/sections";
import type { RunFreshness } from "../run-freshness";

/** A filing version's stored status: the workflow states, and "superseded" for a signed version a later one replaced. */
export type FilingRowStatus = FilingStatus | "superseded";

export const FILING_ROW_STATUS_LABELS: Record<FilingRowStatus, string> = { ...FILING_STATUS_LABELS, superseded: "Superseded" };

export interface PersonRef {
  id: string;
  name: string;
}

export interface SignatureView {
  id: string;
  filingId: string;
  version: number;
  signer: PersonRef;
  signerName: string;
  licenceReference: string;
  contentHash: string;
  signedAt: string;
  attestation: string;
  supersededAt: string | null;
  supersededReason: string | null;
}

export interface CommentView {
  id: string;
  section: string;
  sectionLabel: string;
  /** "submission_note": the note the compliance officer sent with a submission (older ones are stored as replies) */
  kind: "comment" | "changes_requested" | "reply" | "submission_note";
  body: string;
  author: PersonRef;
  createdAt: string;
}

export interface ExceptionView {
  date: string;
  pnl: number;
  var: number;
  excess: number;
  explanation: string;
}

/** One version of a period's filing, as the filing page shows it. */
export interface FilingDetail {
  id: string;
  periodId: string;
  periodEnd: string;
  version: number;
  previousId: string | null;
  previousVersion: number | null;
  status: FilingRowStatus;
  runId: string;
  /** whether the filing's run is still the run the period marks for its filing */
  runIsMarked: boolean;
  coverNote: string;
  reason: string;
  preparedBy: PersonRef;
  submittedBy: PersonRef | null;
  filedAt: string | null;
  filingReference: string | null;
  createdAt: string;
  /** the stored content, with the workflow fields (status, filing date, reference) as they stand now */
  content: FilingViewModel;
  exceptions: ExceptionView[];
  /** the signature in force (null while unsigned) */
  signature: SignatureView | null;
  /** signatures this version once had that a later version superseded */
  supersededSignatures: SignatureView[];
  comments: CommentView[];
}

export interface FilingVersionSummary {
  id: string;
  version: number;
  status: FilingRowStatus;
  reason: string;
  preparedBy: PersonRef;
  createdAt: string;
  signatures: SignatureView[];
  filedAt: string | null;
  filingReference: string | null;
}

/** Everything the filing page of a period needs. */
export interface PeriodFiling {
  period: { id: string; periodEnd: string; deadline: string; state: string; label: string };
  markedRun: { id: string; status: string; startedAt: string; startedByName: string; finishedAt: string | null; freshness: RunFreshness } | null;
  current: FilingDetail | null;
  versions: FilingVersionSummary[];
  /** the signer's last licence reference at this firm, to fill the sign dialog */
  lastLicenceReference: string | null;
  licenceLabel: string;
}

export interface VerifyResult {
  filingId: string;
  version: number;
  signed: boolean;
  /** the hash stored with the signature (null while unsigned) */
  storedHash: string | null;
  /** the hash recomputed now from the stored content */
  recomputedHash: string;
  /** null while unsigned */
  matches: boolean | null;
  signerName: string | null;
  signedAt: string | null;
  superseded: boolean;
  message: string;
}

export interface PackFile {
  fileName: string;
  contentType: string;
  bytes: Uint8Array;
  /** SHA-256 of the bytes, hex */
  sha256: string;
}

export type FilingRow = typeof filings.$inferSelect;
export type PeriodRow = typeof reportingPeriods.$inferSelect;
export type SignatureRow = typeof signatures.$inferSelect;

export const LOCKED: readonly FilingRowStatus[] = ["signed", "filed", "superseded"];
export const EDITABLE: readonly FilingRowStatus[] = ["draft", "changes_requested"];
/** The wording of the attestation the signer ticks (stored with the signature). */
export function attestationText(): string {
  return fragment("attestation");
}


export interface AssembleArgs {
  period: PeriodRow;
  run: RunRecord;
  version: number;
  previous: { version: number; content: FilingViewModel; runId: string; coverNote: string } | null;
  status: FilingStatus;
  preparedBy: string;
  submittedBy: string | null;
  coverNote: string;
  reason: string;
  explanations: Record<string, string>;
  supersededSignatures: SupersededSignature[];
}

/** The primary method's figures at the capital confidence, for comparisons. */
