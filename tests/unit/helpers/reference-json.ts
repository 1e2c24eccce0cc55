/**
 * Reference serialiser: JSON.stringify (ECMA-262 §25.5.2) for every leaf, keys in Array.prototype.sort's default order
 * (UTF-16 code units). Written out here because JSON.stringify itself puts integer-like keys ("9", "10") first.
 * The independent computation the canonical JSON (lib/domain/canonical.ts) is checked against.
 */
export function referenceJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(referenceJson).join(",")}]`;
  if (value && typeof value === "object") {
    const o = value as Record<string, unknown>;
    return `{${Object.keys(o).filter((k) => o[k] !== undefined).sort().map((k) => `${JSON.stringify(k)}:${referenceJson(o[k])}`).join(",")}}`;
  }
  return JSON.stringify(value);
}
