/**
 * Every sentence about the method in the Word pack describes what the engine computed. A matrix of method statement
 * variants goes through a real run (computeRun on stored inputs), the packs' run adapter, the view model and the real
 * Word pack builder; the .docx text is read back, and its method text must name, for every factor, the model the
 * method statement assigns to that factor's asset class (exchange-rate factors by the FX class) — and no model the
 * run did not use. The expected model of each factor is worked out here from the variant, not read from the run.
 */
import JSZip from "jszip";
import { describe, expect, it } from "vitest";
import { BASEL_CAPITAL_PROFILE } from "@/lib/risk/capital/capital";
import { computeRun } from "@/lib/runs/compute";
import { inputHashesOf } from "@/lib/runs/compare";
import type { RunInputs, RunRecord, StoredPosition } from "@/lib/runs/types";
import { DEFAULT_METHOD_CONTENT, methodContentSchema, type MethodContent } from "@/lib/validation/method";
import { buildWordPack } from "@/reports/docx/filing-pack";
import { filingInputFromRun } from "@/reports/run-adapter";
import { buildFilingViewModel } from "@/reports/view-model";
import { syntheticBook } from "../risk/portfolio/synthetic-book";

const CLASSES = ["equity", "government_bond", "etf"] as const;

/** A EUR firm's stored inputs: five instruments (equities, a bond, ETFs), two of them in USD (USDEUR their rate). */
function inputsFor(content: MethodContent): RunInputs {
  const book = syntheticBook(5, 700, 10, 11);
  const dates = book.returns.dates;
  const periodEnd = dates[dates.length - 1];
  const closesOf = (rets: ArrayLike<number>): number[] => {
    const out = [100];
    for (let t = 1; t < rets.length; t++) out.push(out[t - 1] * Math.exp(rets[t]));
    return out;
  };
  const factors: RunInputs["prices"]["factors"] = {};
  for (const [id, rets] of Object.entries(book.returns.factors)) {
    const name = id === "EURUSD" ? "USDEUR" : id;
    const i = Number(id.slice(4));
    factors[name] = name === "USDEUR" ? { assetClass: "fx", currency: "USD", closes: closesOf(rets) } : { assetClass: CLASSES[i % 3], currency: i % 4 === 0 ? "USD" : "EUR", closes: closesOf(rets) };
  }
  const positions: StoredPosition[] = book.positions.map((p, j) => {
    const f = factors[p.instrument];
    const price = f.closes[dates.length - 1] as number;
    return { row: j + 2, book: "Main", instrument: p.instrument, name: p.instrument, assetClass: f.assetClass, currency: f.currency, quantity: p.marketValue / price, price, marketValue: p.marketValue, deltaExposure: null, asOf: periodEnd };
  });
  return {
    positions,
    prices: { dates: [...dates], factors },
    method: { id: "met_matrix", version: 2, approvedAt: "2026-11-02T09:00:00.000Z", content },
    capitalProfile: { id: null, name: "Default", profile: BASEL_CAPITAL_PROFILE, plusFactors: { "5": 0.4, "6": 0.5, "7": 0.65, "8": 0.75, "9": 0.85, "10": 1 }, backtestDays: 250 },
    periodEnd,
    reportingCurrency: "EUR",
    context: { periodId: "per_matrix", upload: { uploadId: "upl_matrix", fileName: "positions.csv" }, dataQuality: { report: { items: [], counts: { error: 0, warning: 0, info: 0 } }, items: 0, errors: 0, warnings: 0 } as never },
  };
}

/** What each variant must show: the model (as a pattern of its label) per asset class, and words of its other choices. */
interface Variant {
  name: string;
  content: Partial<MethodContent>;
  model: Record<string, RegExp>;
  /** labels that must not appear in the method sentences (models the run did not use) */
  absent: RegExp[];
  correlation: RegExp;
  horizon: RegExp;
  backtest: RegExp;
}

const EWMA94 = /^EWMA, λ = 0\.94\b/;
const all = (r: RegExp): Record<string, RegExp> => ({ equity: r, government_bond: r, etf: r, fx: r });

const VARIANTS: Variant[] = [
  { name: "EWMA λ 0.94 everywhere (the default)", content: {}, model: all(EWMA94), absent: [/GARCH/, /(?<!G)ARCH\(/, /Moving average/], correlation: /EWMA/, horizon: /square-root-of-time/, backtest: /every 21 business days/ },
  {
    name: "GARCH(1,1)-t for equities, EWMA 0.97 for FX",
    content: { byAssetClass: { equity: { kind: "garch", distribution: "t", mean: "zero", targeting: false, fallback: "ewma" }, fx: { kind: "ewma", lambdaMode: "fixed", lambda: 0.97 } } },
    model: { equity: /GARCH\(1,1\), Student-t errors/, government_bond: EWMA94, etf: EWMA94, fx: /^EWMA, λ = 0\.97\b/ },
    absent: [/Moving average/, /(?<!G)ARCH\(/],
    correlation: /EWMA/,
    horizon: /square-root-of-time/,
    backtest: /every 21 business days/,
  },
  { name: "moving average 250 days", content: { defaultEstimator: { kind: "ma", window: 250, divisor: "m", mean: "zero" } }, model: all(/^Moving average, 250 days\b/), absent: [/GARCH/, /(?<!G)ARCH\(/, /EWMA, λ/], correlation: /EWMA/, horizon: /square-root-of-time/, backtest: /every 21 business days/ },
  { name: "ARCH(2)", content: { defaultEstimator: { kind: "arch", order: 2 } }, model: all(/^ARCH\(2\)/), absent: [/GARCH/, /Moving average/], correlation: /EWMA/, horizon: /square-root-of-time/, backtest: /every 21 business days/ },
  { name: "EWMA with λ fitted", content: { defaultEstimator: { kind: "ewma", lambdaMode: "fit", lambda: 0.94 } }, model: all(/^EWMA, λ fitted = 0\.\d+ \(starting value 0\.94\)/), absent: [/GARCH/, /(?<!G)ARCH\(/, /Moving average/], correlation: /EWMA/, horizon: /square-root-of-time/, backtest: /every 21 business days/ },
  { name: "equal-weight correlation over 250 days", content: { correlation: { kind: "equal", window: 250 } }, model: all(EWMA94), absent: [/GARCH/], correlation: /equal/i, horizon: /square-root-of-time/, backtest: /every 21 business days/ },
  {
    name: "constant correlation of standardised returns, GARCH(1,1) normal everywhere, term structure",
    content: { defaultEstimator: { kind: "garch", distribution: "normal", mean: "zero", targeting: false, fallback: "ewma" }, correlation: { kind: "ccc" }, scaling: "term" },
    model: all(/GARCH\(1,1\), normal errors/),
    absent: [/Moving average/, /Student-t/],
    correlation: /constant/i,
    horizon: /own variance forecast summed over the 10 days/,
    backtest: /every 21 business days/,
  },
  { name: "five-day horizon, parameters fitted once", content: { horizonDays: 5, backtestRefit: { mode: "once" } }, model: all(EWMA94), absent: [/ten-day/i, /10-day/, /10 days/], correlation: /EWMA/, horizon: /5 days|five/i, backtest: /once|whole sample|in sample/i },
];

function decode(text: string): string {
  return text.replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&quot;/g, '"').replace(/&apos;/g, "'").replace(/&amp;/g, "&");
}
const textOf = (xml: string) => decode([...xml.matchAll(/<w:t(?:\s[^>]*)?>([^<]*)<\/w:t>/g)].map((m) => m[1]).join(""));

/** The Word pack's paragraphs (outside tables) and tables, as text. */
async function readDocx(bytes: Buffer): Promise<{ paragraphs: string[]; tables: string[][][] }> {
  const xml = await (await JSZip.loadAsync(bytes)).file("word/document.xml")!.async("string");
  const tables = [...xml.matchAll(/<w:tbl>([\s\S]*?)<\/w:tbl>/g)].map((t) =>
    [...t[1].matchAll(/<w:tr(?:\s[^>]*)?>([\s\S]*?)<\/w:tr>/g)].map((r) => [...r[1].matchAll(/<w:tc>([\s\S]*?)<\/w:tc>/g)].map((c) => textOf(c[1]))),
  );
  const body = xml.replace(/<w:tbl>[\s\S]*?<\/w:tbl>/g, "");
  return { paragraphs: [...body.matchAll(/<w:p(?:\s[^>]*)?>([\s\S]*?)<\/w:p>/g)].map((m) => textOf(m[1])).filter(Boolean), tables };
}

/** The paragraphs of one section: from its heading to the next heading that starts with one of `next`. */
function sectionText(paragraphs: string[], heading: RegExp, next: RegExp): string[] {
  const start = paragraphs.findIndex((p) => heading.test(p));
  expect(start, `a section headed ${heading}`).toBeGreaterThanOrEqual(0);
  const rest = paragraphs.slice(start + 1);
  const end = rest.findIndex((p) => next.test(p));
  return end < 0 ? rest : rest.slice(0, end);
}

describe("the Word pack's method text names the models the engine used", () => {
  for (const v of VARIANTS) {
    it(v.name, async () => {
      const content = methodContentSchema.parse({ ...DEFAULT_METHOD_CONTENT, portfolioVolatility: "asset-class", ...v.content });
      const inputs = inputsFor(content);
      const results = await computeRun(inputs);
      const model = results.monthEnd.model!;
      expect(model.covariance).toBe("per-factor");
      const run: RunRecord = {
        id: "run_matrix", periodId: "per_matrix", status: "completed", stage: "done", progress: 1, inputHashes: inputHashesOf(inputs), engineVersion: results.monthEnd.engineVersion, results, error: null,
        isFilingRun: true, reproducesRunId: null, startedBy: "usr_priya", startedByName: "Priya Castell", startedAt: "2026-12-01T09:00:00.000Z", finishedAt: "2026-12-01T09:00:04.000Z", methodVersion: { id: "met_matrix", version: 2 },
      };
      const vm = buildFilingViewModel(
        filingInputFromRun({
          run,
          method: { rationale: "The firm's reasons for this method, in a sentence or two.", limitations: [] },
          firm: { name: "Northmoor Brokerage Ltd", reportingCurrency: "EUR", regulatorName: "Financial Markets Authority (demo)", licenceLabel: "Registration no." },
          period: { end: inputs.periodEnd, deadline: null },
          filing: { id: "fil_matrix", version: 1, previousVersion: null, status: "draft", preparedBy: "Tomas Reyne" },
        }),
      );
      const docx = await readDocx(await buildWordPack(vm, { charts: false }));
      // the method sentences: from the section heading to its "Rationale" sub-heading
      const method = sectionText(docx.paragraphs, /^Method statement$/, /^Rationale$/);
      const joined = method.join("\n");

      // every factor the run used is in the pack's table of models, with the model its asset class is assigned
      const annex = docx.tables.find((t) => t[0]?.[0] === "Factor" && t[0]?.[2] === "Model used");
      expect(annex, "the method annex's table of models").toBeDefined();
      const classOf = (factor: string) => inputs.prices.factors[factor].assetClass;
      expect(annex!.slice(1).map((r) => r[0]).sort()).toEqual([...results.monthEnd.factors.used].sort());
      for (const row of annex!.slice(1)) {
        const [factor, , label] = row;
        expect(label, `${factor} (${classOf(factor)})`).toMatch(v.model[classOf(factor)]);
        const used = model.factors.find((f) => f.factor === factor)!;
        // the pack names the model the engine used: its label, and its fallback when it took one
        expect(label).toContain(used.label);
        if (used.fallback) expect(label).toContain(used.fallback.label);
      }
      // the method sentences name each factor with that model
      const volatilitySentence = method.find((p) => p.startsWith("Volatility of each risk factor"));
      expect(volatilitySentence, joined).toBeDefined();
      for (const f of model.factors) {
        const group = volatilitySentence!.split("; ").find((part) => part.includes(f.label) && new RegExp(`\\b${f.factor}\\b`).test(part));
        expect(group, `${f.factor} with ${f.label} in: ${volatilitySentence}`).toBeDefined();
      }
      for (const a of v.absent) expect(joined).not.toMatch(a);
      expect(joined).toMatch(v.correlation);
      expect(joined).toMatch(v.horizon);
      expect(joined).toMatch(v.backtest);
    }, 120_000);
  }
});
