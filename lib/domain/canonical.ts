/**
 * The one canonical JSON and hash: a run's stored inputs and their hashes, the filing content a signature covers,
 * and field-by-field comparisons all use these, so the same value always gives the same text and the same SHA-256
 * whatever order its keys were built in. Pure (node:crypto only).
 *
 * Rules: object keys sorted by UTF-16 code unit; array order kept; an object key whose value is undefined is left
 * out, an undefined array item or a lone undefined is written null (as JSON.stringify writes an array item); numbers
 * in ECMAScript's shortest round-trip form (Number::toString, the same on every engine), −0 written as 0, NaN and
 * ±Infinity refused; a typed array is written as the array of its numbers; strings as JSON.stringify escapes them;
 * no whitespace. Anything else (a Date, a Map, a class instance, a function, a bigint) is refused, naming where it
 * is, rather than written as something that would hash the same for different values.
 */
import { createHash } from "node:crypto";

/** A typed array (Float64Array and friends): written as the plain array of its numbers. */
function isTypedArray(value: object): value is ArrayLike<number | bigint> {
  return ArrayBuffer.isView(value) && !(value instanceof DataView);
}

/** Canonical JSON of a JSON-safe value. @throws {TypeError} naming the path of a value with no canonical form */
export function canonicalJson(value: unknown, path = "$"): string {
  if (value === null || value === undefined) return "null";
  switch (typeof value) {
    case "boolean":
      return value ? "true" : "false";
    case "number":
      if (!Number.isFinite(value)) throw new TypeError(`canonicalJson: ${path} is ${value}, which has no JSON form`);
      return Object.is(value, -0) ? "0" : String(value);
    case "string":
      return JSON.stringify(value);
    case "object": {
      if (Array.isArray(value)) return `[${value.map((v, i) => canonicalJson(v, `${path}[${i}]`)).join(",")}]`;
      if (isTypedArray(value)) return canonicalJson(Array.from(value), path);
      const proto = Object.getPrototypeOf(value);
      if (proto !== Object.prototype && proto !== null) {
        throw new TypeError(`canonicalJson: ${path} is a ${proto?.constructor?.name ?? "non-plain object"}, not a plain object, so it has no JSON form`);
      }
      const record = value as Record<string, unknown>;
      const entries = Object.keys(record)
        .filter((k) => record[k] !== undefined)
        .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0))
        .map((k) => `${JSON.stringify(k)}:${canonicalJson(record[k], `${path}.${k}`)}`);
      return `{${entries.join(",")}}`;
    }
    default:
      throw new TypeError(`canonicalJson: ${path} is a ${typeof value}, which has no JSON form`);
  }
}

/** SHA-256 (lower-case hex) of a string's UTF-8 bytes. */
export function sha256Hex(text: string): string {
  return createHash("sha256").update(text, "utf8").digest("hex");
}

/** SHA-256 of the canonical JSON of a value. */
export function hashOf(value: unknown): string {
  return sha256Hex(canonicalJson(value));
}
