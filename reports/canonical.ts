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
 * Serialisation rules: object keys sorted by UTF-16 code unit; array order kept; a key whose value is undefined is
 * left out; numbers as ECMAScript's shortest round-trip form (Number.prototype.toString, the same on every engine),
 * −0 written as 0, NaN and ±Infinity refused; strings as JSON.stringify escapes them; no whitespace.
 */
import { createHash } from "node:crypto";
import type { FilingViewModel } from "./view-model";

/** Names the layout of the canonical content; a change of layout is a new name. */
export const CANONICAL_SCHEMA = "ballast-filing-content/1";

/** Key-sorted JSON of a plain value. @throws {TypeError} on a non-finite number or a value JSON cannot hold */
export function canonicalJson(value: unknown, path = "$"): string {
  if (value === null) return "null";
  switch (typeof value) {
    case "boolean":
      return value ? "true" : "false";
    case "number":
      if (!Number.isFinite(value)) throw new TypeError(`canonicalJson: ${path} is ${value}, which has no canonical form`);
      return Object.is(value, -0) ? "0" : String(value);
    case "string":
      return JSON.stringify(value);
    case "object": {
      if (Array.isArray(value)) return `[${value.map((v, i) => (v === undefined ? "null" : canonicalJson(v, `${path}[${i}]`))).join(",")}]`;
      const proto = Object.getPrototypeOf(value);
      if (proto !== Object.prototype && proto !== null) throw new TypeError(`canonicalJson: ${path} is a ${proto?.constructor?.name ?? "non-plain object"}, not a plain object`);
      const entries = Object.keys(value as Record<string, unknown>)
        .filter((k) => (value as Record<string, unknown>)[k] !== undefined)
        .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0))
        .map((k) => `${JSON.stringify(k)}:${canonicalJson((value as Record<string, unknown>)[k], `${path}.${k}`)}`);
      return `{${entries.join(",")}}`;
    }
    default:
      throw new TypeError(`canonicalJson: ${path} is a ${typeof value}, which JSON cannot hold`);
  }
}

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
  return createHash("sha256").update(canonicalContent(vm), "utf8").digest("hex");
}
