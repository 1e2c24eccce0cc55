import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import path from "node:path";

const root = path.resolve(__dirname, "../../../..");
const fixtures = "tests/fixtures/engine";

function engine(...args: string[]) {
  const r = spawnSync(process.execPath, ["--import", "tsx", "lib/engine-cli.ts", ...args], { cwd: root, encoding: "utf8" });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("engine command line: var, backtest, capital", () => {
  it("var: wide and long price files give the same figures, with the keys the issue asks for", () => {
    const common = ["--positions", `${fixtures}/positions.csv`, "--reporting-currency", "USD", "--json"];
    const wide = engine("var", "--prices", `${fixtures}/prices-wide.csv`, ...common);
    const long = engine("var", "--prices", `${fixtures}/prices-long.csv`, ...common);
    expect(wide.status).toBe(0);
    expect(long.status).toBe(0);
    const a = JSON.parse(wide.stdout);
    const b = JSON.parse(long.stdout);
    for (const key of ["var", "es", "confidence", "horizonDays", "method", "portfolioVolatility", "contributions", "byAssetClass", "warnings"]) expect(a).toHaveProperty(key);
    expect(a.var).toBeCloseTo(b.var, 8);
    const sum = a.contributions.reduce((s: number, c: { componentVar: number }) => s + c.componentVar, 0);
    expect(sum).toBeCloseTo(a.var, 6);
    expect(a.warnings.map((w: { code: string }) => w.code)).toContain("position-excluded");
  }, 60_000);

  it("backtest: days, exceptions, zone, plus factor and both coverage tests", () => {
    const r = engine("backtest", "--input", `${fixtures}/backtest.csv`, "--json");
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.days).toBe(250);
    expect(out.exceptions).toBe(out.exceptionList.length);
    expect(["green", "yellow", "red"]).toContain(out.zone);
    expect(out.kupiec).toHaveProperty("pValue");
    expect(out.christoffersen).toHaveProperty("pValueCc");
  }, 60_000);

  it("capital: every term, the multiplier from the exceptions", () => {
    const r = engine("capital", "--input", `${fixtures}/capital.csv`, "--exceptions", "5", "--json");
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.multiplier).toBeCloseTo(3.4, 12);
    expect(out.capital).toBeCloseTo(out.varTerm + out.stressedVarTerm, 6);
  }, 60_000);

  it("bad input exits non-zero with one line naming the problem", () => {
    const r = engine("capital", "--input", `${fixtures}/backtest.csv`, "--json");
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
    expect(r.stderr).toMatch(/missing column "svar"/);
    const v = engine("var", "--positions", `${fixtures}/positions.csv`, "--prices", `${fixtures}/prices-wide.csv`, "--json");
    expect(v.status).toBe(1);
    expect(v.stderr).toMatch(/several currencies/);
  }, 60_000);
});
