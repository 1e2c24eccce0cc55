import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { parseCorrelation, parseModel, parseVolSpecs } from "@/lib/engine-cli/specs";
import { checkDates } from "@/lib/engine-cli/volatility";

const root = path.resolve(__dirname, "../../../..");
const fixtures = "tests/fixtures/engine";
function engine(...args: string[]) {
  const r = spawnSync(process.execPath, ["--import", "tsx", "lib/engine-cli.ts", ...args], { cwd: root, encoding: "utf8" });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}
const common = ["--positions", `${fixtures}/positions.csv`, "--prices", `${fixtures}/prices-wide.csv`, "--reporting-currency", "USD", "--json"];

describe("engine var --vol and --corr", () => {
  it("parses FACTOR=MODEL lists, default= and the correlation spec", () => {
    const ids = new Set(["A", "B", "EURUSD"]);
    expect(parseVolSpecs("A=garch-t,EURUSD=ewma:0.97,default=ma:60", ids)).toEqual({
      choice: { default: { kind: "ma", window: 60 }, byFactor: { A: { kind: "garch", distribution: "t" }, EURUSD: { kind: "ewma", lambda: 0.97 } } },
      defaultGiven: true,
    });
    expect(parseModel("ewma:fit", "x")).toEqual({ kind: "ewma", lambda: 0.94, fit: true });
    expect(parseModel("arch:3", "x")).toEqual({ kind: "arch", order: 3 });
    expect(parseModel("garch", "x")).toEqual({ kind: "garch" });
    expect(parseCorrelation("equal:250")).toEqual({ kind: "equal", window: 250 });
    expect(parseCorrelation("ewma:0.97")).toEqual({ kind: "ewma", lambda: 0.97 });
    expect(parseCorrelation("ccc")).toEqual({ kind: "ccc" });
    expect(() => parseVolSpecs("Z=garch", ids)).toThrow(/no factor "Z"/);
    expect(() => parseVolSpecs("A=egarch", ids)).toThrow(/must be one of ma:M, ewma:L, ewma:fit, arch:M, garch or garch-t/);
    expect(() => parseVolSpecs("A=ewma:1.5", ids)).toThrow(/λ must be fit or a number between 0 and 1/);
    expect(() => parseCorrelation("dcc")).toThrow(/--corr must be equal:N, ewma:L or ccc/);
  });

  it("prints factors[] with each model and one-day variance and the correlation used; without them, today's output", () => {
    const per = engine("var", ...common, "--vol", "ALPHA-EQ=garch-t,EURUSD=ewma:0.97,default=ewma:0.94", "--corr", "ewma:0.94");
    expect(per.status, per.stderr).toBe(0);
    const out = JSON.parse(per.stdout);
    const byName = Object.fromEntries(out.factors.map((f: { factor: string }) => [f.factor, f]));
    expect(byName["ALPHA-EQ"].model).toMatch(/^GARCH\(1,1\), Student-t errors/);
    expect(byName.EURUSD.model).toBe("EWMA, λ = 0.97, zero mean");
    expect(byName["CHARLIE-BD"].model).toBe("EWMA, λ = 0.94, zero mean");
    for (const f of out.factors) expect(f.variance).toBeGreaterThan(0);
    expect(out.correlation.factors).toEqual(out.factors.map((f: { factor: string }) => f.factor));
    out.correlation.matrix.forEach((row: number[], i: number) => expect(row[i]).toBeCloseTo(1, 12));
    const plain = JSON.parse(engine("var", ...common).stdout);
    const again = JSON.parse(engine("var", ...common, "--vol", "default=ewma:0.94").stdout);
    expect(plain.factors.every((f: { model: string }) => f.model === "EWMA, λ = 0.94, zero mean")).toBe(true);
    // today's single EWMA covariance starts from the first 30 days, the per-factor EWMA from the sample: close, not equal
    expect(Math.abs(again.var - plain.var) / plain.var).toBeLessThan(0.05);
    expect(again.var).not.toBe(plain.var);
  }, 60_000);

  it("--horizon with --scaling term sums each factor's own forecast; bad specs exit 1 naming the item", () => {
    const term = JSON.parse(engine("var", ...common, "--vol", "default=garch", "--horizon", "10", "--scaling", "term").stdout);
    expect(term.horizonDays).toBe(10);
    expect(term.scaling).toMatch(/each factor's own variance term structure/);
    const bad = engine("var", ...common, "--vol", "NOPE=garch");
    expect(bad.status).toBe(1);
    expect(bad.stderr.trim().split("\n")).toHaveLength(1);
    expect(bad.stderr).toMatch(/--vol: "NOPE=garch": no factor "NOPE"/);
    expect(engine("var", ...common, "--corr", "ccc").stderr).toMatch(/--corr applies with --vol/);
  }, 60_000);
});

describe("engine fit refuses repeated and unsorted dates", () => {
  it("names the row", () => {
    const t = (rows: string[]) => ({ header: ["date", "ret"], rows: rows.map((d) => [d, "0.01"]) });
    expect(() => checkDates(t(["2024-01-02", "2024-01-03", "2024-01-03"]))).toThrow(/row 4, column "date": the date 2024-01-03 appears twice \(first at row 3\)/);
    expect(() => checkDates(t(["2024-01-02", "2024-01-04", "2024-01-03"]))).toThrow(/row 4, column "date": dates must increase \(2024-01-04 then 2024-01-03\)/);
    expect(() => checkDates(t(["d1", "d10", "d2"]))).not.toThrow(); // labels that are not ISO dates: only repeats are refused
    const dir = mkdtempSync(path.join(tmpdir(), "ballast-fit-"));
    const file = path.join(dir, "r.csv");
    writeFileSync(file, "date,ret\n" + Array.from({ length: 300 }, (_, i) => `2024-${String(1 + Math.floor(i / 28)).padStart(2, "0")}-${String(1 + (i % 28)).padStart(2, "0")},${(i % 7) / 1000 - 0.003}`).join("\n") + "\n2024-01-05,0.01\n");
    const r = engine("fit", "--model", "ewma", "--input", file, "--json");
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/row 302, column "date": the date 2024-01-05 appears twice \(first at row 6\)/);
  }, 60_000);
});
