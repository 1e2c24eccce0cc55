import { describe, expect, it } from "vitest";
import { canonicalJson, hashOf, sha256Hex } from "@/lib/domain/canonical";
import { referenceJson } from "../helpers/reference-json";

describe("the one canonical JSON", () => {
  it("equals the reference serialisation for plain JSON values, integer-like keys sorted as strings", () => {
    const values: unknown[] = [
      { b: 1, a: [2, { d: null, c: "x" }], e: { z: true, y: false } },
      [0.1 + 0.2, 1e21, 5e-7, -0, -123.456, 2 ** 53],
      { "λ": "a \"quoted\"\nline", "": "", "10": 1, "9": 2, Z: 3, a: 4 },
      "plain",
      42,
      null,
    ];
    // the reference: JSON.stringify (ECMA-262 §25.5.2) for every leaf, keys sorted by UTF-16 code unit (helpers/reference-json.ts)
    for (const v of values) expect(canonicalJson(v)).toBe(referenceJson(v));
    expect(canonicalJson({ 9: "b", 10: "a" })).toBe('{"10":"a","9":"b"}'); // by code unit, not numerically
  });

  it("writes typed arrays as arrays and undefined as JSON.stringify does in arrays; leaves undefined keys out", () => {
    expect(canonicalJson({ v: Float64Array.from([1.5, -0, 2]) })).toBe('{"v":[1.5,0,2]}');
    expect(canonicalJson({ a: undefined, b: [undefined, 1] })).toBe('{"b":[null,1]}');
    expect(canonicalJson(undefined)).toBe("null");
  });

  it("refuses what would hash the same for different values, naming where it is", () => {
    expect(() => canonicalJson({ when: new Date(0) })).toThrow("$.when is a Date");
    expect(() => canonicalJson({ m: [new Map([[1, 2]])] })).toThrow("$.m[0] is a Map");
    expect(() => canonicalJson({ a: [1, Number.NaN] })).toThrow("$.a[1] is NaN, which has no JSON form");
    expect(() => canonicalJson({ n: 1n })).toThrow("$.n is a bigint");
    expect(() => canonicalJson({ f: () => 1 })).toThrow("$.f is a function");
  });

  it("hashes by SHA-256 (FIPS 180-2, Appendix B.1: SHA-256(\"abc\"))", () => {
    expect(sha256Hex("abc")).toBe("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
    expect(hashOf("abc")).toBe(sha256Hex('"abc"'));
    expect(hashOf({ b: 1, a: 2 })).toBe(hashOf({ a: 2, b: 1 }));
  });
});
