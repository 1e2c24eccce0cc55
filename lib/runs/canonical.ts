/**
 * Canonical JSON (object keys sorted, no whitespace, numbers as JavaScript writes them, which round-trip exactly)
 * and its SHA-256: the same input always gives the same hash, whatever order its keys were built in.
 */
import { createHash } from "node:crypto";

/** Canonical JSON of a JSON-safe value. Non-finite numbers are refused: they have no JSON form. */
export function canonicalJson(value: unknown): string {
  if (value === null || value === undefined) return "null";
  if (typeof value === "number") {
    if (!Number.isFinite(value)) throw new RangeError(`canonicalJson: ${value} has no JSON form`);
    return JSON.stringify(value);
  }
  if (typeof value === "string" || typeof value === "boolean") return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map((v) => canonicalJson(v)).join(",")}]`;
  if (ArrayBuffer.isView(value)) return canonicalJson(Array.from(value as unknown as ArrayLike<number>));
  if (typeof value === "object") {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(",")}}`;
  }
  throw new TypeError(`canonicalJson: cannot write a ${typeof value}`);
}

/** SHA-256 (hex) of a string's UTF-8 bytes. */
export function sha256Hex(text: string): string {
  return createHash("sha256").update(text, "utf8").digest("hex");
}

/** SHA-256 of the canonical JSON of a value. */
export function hashOf(value: unknown): string {
  return sha256Hex(canonicalJson(value));
}
