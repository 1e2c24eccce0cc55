import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { spawnSync } from "node:child_process";
import { tmpdir } from "node:os";
import path from "node:path";
import { commands } from "@/lib/engine-cli/volatility";
import { CliError } from "@/lib/engine-cli/io";
import { mulberry32, normalSampler, simulateGarch11 } from "@/lib/risk";

let dir = "";
const file = (name: string, text: string): string => { const p = path.join(dir, name); writeFileSync(p, text); return p; };

/** Run a command in-process and return what it printed. */
function run(argv: string[]): string {
  let out = "";
  const spy = vi.spyOn(process.stdout, "write").mockImplementation((chunk: string | Uint8Array) => { out += String(chunk); return true; });
  try { commands[argv[0]](argv.slice(1)); } finally { spy.mockRestore(); }
  return out;
}

let returnsCsv = "", pricesCsv = "";
beforeAll(() => {
  dir = mkdtempSync(path.join(tmpdir(), "ballast-cli-"));
  const r = Array.from(simulateGarch11(normalSampler(mulberry32(8)), { omega: 2e-6, alpha: 0.08, beta: 0.9 }, 600));
  returnsCsv = file("returns.csv", "date,ret\n" + r.map((v, i) => `d${i},${v}`).join("\n") + "\n");
  let p = 100;
  pricesCsv = file("prices.csv", "date,close,volume\n" + r.map((v, i) => { p *= Math.exp(v); return `d${i},${p},${1000 + i}`; }).join("\n") + "\n");
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("engine fit", () => {
  it("prints one JSON object with the documented keys for every model", () => {
    for (const model of ["ma", "arch", "ewma", "garch"]) {
      const out = JSON.parse(run(["fit", "--model", model, "--input", returnsCsv, "--horizon", "5", "--json"]));
      for (const key of ["model", "n", "params", "standardErrors", "logLikelihood", "variance", "longRunVariance", "forecast", "warnings", "limitations"]) expect(out, `${model} ${key}`).toHaveProperty(key);
      expect(out.model).toBe(model);
      expect(out.n).toBe(600);
      expect(out.forecast).toHaveLength(5);
    }
  });
  it("takes the named column, or the last numeric one; prices become log returns unless --returns simple", () => {
    const byName = JSON.parse(run(["fit", "--model", "ewma", "--input", pricesCsv, "--column", "close", "--input-kind", "prices", "--json"]));
    expect(byName.n).toBe(599);
    expect(byName.input.column).toBe("close");
    const last = JSON.parse(run(["fit", "--model", "ewma", "--input", pricesCsv, "--input-kind", "prices", "--json"]));
    expect(last.input.column).toBe("volume");
    const simple = JSON.parse(run(["fit", "--model", "ewma", "--input", pricesCsv, "--column", "close", "--input-kind", "prices", "--returns", "simple", "--json"]));
    expect(simple.variance).not.toBe(byName.variance);
  });
  it("passes the estimator options through", () => {
    const ma = JSON.parse(run(["fit", "--model", "ma", "--input", returnsCsv, "--window", "50", "--divisor", "m-1", "--mean", "sample", "--json"]));
    expect(ma.params.window).toBe(50);
    expect(ma.diagnostics.divisor).toBe("m-1");
    const ewma = JSON.parse(run(["fit", "--model", "ewma", "--input", returnsCsv, "--lambda", "fit", "--init", "first-20", "--json"]));
    expect(ewma.diagnostics.lambdaFitted).toBe(true);
    expect(ewma.initialization).toMatch(/^first-20/);
    const arch = JSON.parse(run(["fit", "--model", "arch", "--input", returnsCsv, "--order", "3", "--json"]));
    expect(Object.keys(arch.params)).toEqual(["omega", "alpha1", "alpha2", "alpha3"]);
    const garch = JSON.parse(run(["fit", "--model", "garch", "--input", returnsCsv, "--dist", "t", "--targeting", "--json"]));
    expect(garch.params.nu).toBeGreaterThan(2);
    expect(garch.diagnostics.targeting).toBe(true);
  });
  it("refuses bad input with one line naming the problem and the row", () => {
    const expectError = (argv: string[], message: RegExp) => expect(() => run(argv)).toThrow(message);
    expectError(["fit", "--model", "garch", "--input", path.join(dir, "absent.csv")], /file not found/);
    expectError(["fit", "--model", "garch", "--input", file("text.csv", "name\nabc\n")], /no numeric column/);
    expectError(["fit", "--model", "garch", "--input", file("short.csv", "r\n" + "0.01\n-0.01\n".repeat(20))], /fitGarch11 requires at least 100 returns/);
    expectError(["fit", "--model", "ewma", "--input", file("neg.csv", "p\n100\n101\n-3\n"), "--input-kind", "prices"], /row 4, column "p": price -3 is not positive/);
    expectError(["fit", "--model", "ewma", "--input", file("bad.csv", "r\n0.01\nx\n"), "--json"], /row 3, column "r": "x" is not a number/);
    expectError(["fit", "--model", "garch", "--input", returnsCsv, "--colour", "red"], /unknown option --colour/);
    expectError(["fit", "--model", "spline", "--input", returnsCsv], /--model must be one of/);
    expect(() => run(["fit", "--model", "garch", "--input", returnsCsv, "--dist", "cauchy"])).toThrow(CliError);
  });
  it("the real command line exits 1 with one line on stderr", () => {
    const root = path.resolve(__dirname, "../../..");
    const r = spawnSync("npx", ["tsx", "lib/engine-cli.ts", "fit", "--model", "garch", "--input", "no-such-file.csv", "--json"], { cwd: root, encoding: "utf8" });
    expect(r.status).toBe(1);
    expect(r.stdout).toBe("");
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
    expect(r.stderr).toMatch(/file not found: no-such-file.csv/);
  });
});

describe("engine compare", () => {
  it("ranks the estimators and reads the result in one sentence", () => {
    const out = JSON.parse(run(["compare", "--input", returnsCsv, "--evaluation", "100", "--json"]));
    expect(out.evaluationDays).toBe(100);
    expect(out.estimationDays).toBe(500);
    expect(out.ranking.length).toBeGreaterThanOrEqual(6);
    expect(out.reading).toMatch(/^Over the 100-day evaluation window, .+ gave the best/);
    const q = out.ranking.map((r: { qlike: number }) => r.qlike);
    expect(q).toEqual([...q].sort((a: number, b: number) => a - b));
  });
});
