import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { canonicalJson } from "@/lib/domain/canonical";
import { canonicalContent, contentHash, signedContent, CANONICAL_SCHEMA } from "@/reports/canonical";
import type { FilingViewModel } from "@/reports/view-model";
import { packFixture } from "./fixture";

/** A deep copy with every object's keys inserted in reverse order. */
function reversedKeys<T>(value: T): T {
  if (Array.isArray(value)) return value.map(reversedKeys) as T;
  if (value && typeof value === "object") {
    const out: Record<string, unknown> = {};
    for (const k of Object.keys(value).reverse()) out[k] = reversedKeys((value as Record<string, unknown>)[k]);
    return out as T;
  }
  return value;
}

/** Every numeric leaf under `root`, as a path of keys. */
function numericPaths(root: unknown, prefix: (string | number)[] = []): (string | number)[][] {
  if (typeof root === "number") return [prefix];
  if (Array.isArray(root)) return root.flatMap((v, i) => numericPaths(v, [...prefix, i]));
  if (root && typeof root === "object") return Object.entries(root).flatMap(([k, v]) => numericPaths(v, [...prefix, k]));
  return [];
}

function getAt(root: unknown, path: (string | number)[]): unknown {
  return path.reduce<unknown>((o, k) => (o as Record<string | number, unknown>)[k], root);
}

function setAt(root: unknown, path: (string | number)[], value: unknown): void {
  const parent = getAt(root, path.slice(0, -1)) as Record<string | number, unknown>;
  parent[path[path.length - 1]] = value;
}

/** The next larger double (one unit in the last place). */
function nextUp(x: number): number {
  if (x === 0) return Number.MIN_VALUE;
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const bits = view.getBigUint64(0);
  view.setBigUint64(0, x > 0 ? bits + 1n : bits - 1n);
  return view.getFloat64(0);
}

describe("canonicalJson", () => {
  it("sorts keys at every level and keeps array order", () => {
    const a = canonicalJson({ b: 1, a: { d: [3, 1, 2], c: "x" } });
    const b = canonicalJson({ a: { c: "x", d: [3, 1, 2] }, b: 1 });
    expect(a).toBe('{"a":{"c":"x","d":[3,1,2]},"b":1}');
    expect(b).toBe(a);
  });

  it("writes numbers in ECMAScript's shortest round-trip form (ECMA-262, Number::toString)", () => {
    // ECMA-262 §6.1.6.1.20 Number::toString: the shortest digits that round-trip, exponent form from 1e21 and below 1e-6
    expect(canonicalJson(0.1 + 0.2)).toBe("0.30000000000000004");
    expect(canonicalJson(1)).toBe("1");
    expect(canonicalJson(1.5e21)).toBe("1.5e+21");
    expect(canonicalJson(5e-7)).toBe("5e-7");
    expect(canonicalJson(123456.789)).toBe("123456.789");
    expect(canonicalJson(-0)).toBe("0");
    expect(canonicalJson([nextUp(1)])).toBe("[1.0000000000000002]");
  });

  it("refuses what has no canonical form, naming where it is", () => {
    expect(() => canonicalJson({ a: [1, Number.NaN] })).toThrow("$.a[1] is NaN");
    expect(() => canonicalJson({ a: Infinity })).toThrow("$.a is Infinity");
    expect(() => canonicalJson({ when: new Date(0) })).toThrow("$.when is a Date");
    expect(() => canonicalJson({ f: () => 1 })).toThrow("$.f is a function");
  });

  it("leaves out undefined keys, writes an undefined array item as null and strings as JSON does", () => {
    expect(canonicalJson({ a: undefined, b: null, c: [undefined] })).toBe('{"b":null,"c":[null]}');
    expect(canonicalJson("λ = 0.94 \"quoted\"\n")).toBe('"λ = 0.94 \\"quoted\\"\\n"');
  });
});

describe("canonicalContent and contentHash", () => {
  it("do not depend on the order keys were inserted in", async () => {
    const { vm } = await packFixture();
    const shuffled = reversedKeys(vm);
    expect(JSON.stringify(shuffled)).not.toBe(JSON.stringify(vm));
    expect(canonicalContent(shuffled)).toBe(canonicalContent(vm));
    expect(contentHash(shuffled)).toBe(contentHash(vm));
  });

  it("is the SHA-256 of the canonical JSON, named by its schema", async () => {
    const { vm } = await packFixture();
    const text = canonicalContent(vm);
    expect(contentHash(vm)).toBe(createHash("sha256").update(text, "utf8").digest("hex"));
    expect(contentHash(vm)).toMatch(/^[0-9a-f]{64}$/);
    expect(JSON.parse(text).schema).toBe(CANONICAL_SCHEMA);
    expect(text).toBe(canonicalJson(JSON.parse(text))); // canonical form is a fixed point
  });

  it("is unchanged by workflow state: status, signature, superseded signatures, filing date and reference", async () => {
    const { vm, signed } = await packFixture();
    expect(contentHash(signed)).toBe(contentHash(vm));
    expect(signed.signOff?.contentHash).toBe(contentHash(vm));
    const filed: FilingViewModel = { ...signed, filing: { ...signed.filing, status: "filed", filedAt: "2026-12-10", filingReference: "FMA-2026-11-0042" } };
    expect(contentHash(filed)).toBe(contentHash(vm));
    expect(Object.keys(signedContent(vm))).not.toContain("signOff");
  });

  it("changes when any figure changes, even in its last bit", async () => {
    const { vm } = await packFixture();
    const copy = structuredClone(vm);
    const base = contentHash(copy);
    const paths = numericPaths(copy.figures, ["figures"]);
    expect(paths.length).toBeGreaterThan(1000);
    // every 7th numeric leaf (a fixed, deterministic sample across every table) plus named headline figures
    const sample = paths.filter((_p, i) => i % 7 === 0);
    sample.push(["figures", "capital", "capital"], ["figures", "totals", 0, "byConfidence", 0, "oneDay", "var"], ["figures", "backtest", "exceptionList", 0, "pnl"], ["figures", "correlation", "matrix", 1, 2]);
    for (const path of sample) {
      const old = getAt(copy, path) as number;
      setAt(copy, path, nextUp(old));
      const h = contentHash(copy);
      expect(h, path.join(".")).not.toBe(base);
      setAt(copy, path, old);
    }
    expect(contentHash(copy)).toBe(base);
  });

  it("changes when any signed text changes", async () => {
    const { vm } = await packFixture();
    const base = contentHash(vm);
    const edits: ((v: FilingViewModel) => void)[] = [
      (v) => (v.filing.coverNote += "."),
      (v) => (v.filing.exceptionExplanations[0].text += "."),
      (v) => (v.figures.backtest.exceptionList[0].explanation += "."),
      (v) => (v.method.rationale += "."),
      (v) => (v.method.sentences[0] += "."),
      (v) => (v.limitations[0].text += "."),
      (v) => (v.dataQuality.items[0].message += "."),
      (v) => (v.caution += "."),
      (v) => (v.engine.inputHashes[0].hash = "0".repeat(64)),
      (v) => (v.engine.version = "9.9.9"),
      (v) => (v.filing.version += 1),
      (v) => (v.firm.name += " Ltd"),
    ];
    for (const edit of edits) {
      const copy = structuredClone(vm);
      edit(copy);
      expect(contentHash(copy)).not.toBe(base);
    }
  });
});
