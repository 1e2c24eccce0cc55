/**
 * The filing's canonical content: the figures and text exactly as signed, serialised as key-sorted JSON, and its
 * SHA-256. Signing stores the hash; verifying recomputes it from the same view model and compares.
 *
 * What is signed: every part of the view model (firm, period, the filing's version, preparer, submitter, cover note,
 * reason, changes and exception explanations, every figure, the method statement, limitations, data quality, the
 * engine version and input hashes, the caution) except the workflow state that changes after signing without
 * changing what was signed: the status, the filing date and regulator's reference, the signature itself and the
 * superseded signatures. Nothing about rendering (no timestamps, no template wording, no number formatting) is in
 * it: the packs format the same numbers differently, the hash stays.
 *
 * Serialisation: the one canonical JSON of lib/domain/canonical.ts (keys sorted, numbers in their shortest round-trip
 * form, no whitespace; the same rules as a run's input hashes), and its SHA-256.
 */
import { canonicalJson, sha256Hex } from "@/lib/domain/canonical";
import type { FilingViewModel } from "./view-model";

/** Names the layout of the canonical content; a change of layout is a new name. */
export const CANONICAL_SCHEMA = "ballast-filing-content/1";

/** The signed part of the view model (see the file's comment for what is left out). */
export function signedContent(vm: FilingViewModel): Record<string, unknown> {
  const { signOff: _signOff, supersededSignatures: _superseded, filing, ...rest } = vm;
  void _signOff;
  void _superseded;
  const { status: _status, filedAt: _filedAt, filingReference: _reference, ...filingSigned } = filing;
  void _status;
  void _filedAt;
  void _reference;
  return { schema: CANONICAL_SCHEMA, ...rest, filing: filingSigned };
}

/** The canonical content of a filing: stable, key-sorted JSON of the figures and text as signed. */
export function canonicalContent(vm: FilingViewModel): string {
  return canonicalJson(signedContent(vm));
}

/** SHA-256 (lower-case hex) of the canonical content. */
export function contentHash(vm: FilingViewModel): string {
  return sha256Hex(canonicalContent(vm));
}
