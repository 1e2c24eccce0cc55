/**
 * A run's stored results on a big book, whole and with the per-position detail apart (lib/runs/detail.ts): a
 * synthetic 200,000-position book (invented instruments, seeded returns) through the engine once (parametric and
 * historical VaR/ES, EWMA covariance), then the sizes and JSON parse times of what a read of the run costs — the
 * whole results (as runs stored them before) against the figures alone (what the run's page, lists and filing checks
 * now read), and the gzip size and time of the detail row. Printed, not asserted.
 */
import { performance } from "node:perf_hooks";
import { gzipSync } from "node:zlib";
import { emit, median } from "../emit";
import { runMonthEnd, type MonthEndMethod } from "../../../lib/risk/portfolio/run-month-end";
import { splitDetail } from "../../../lib/runs/detail";
import type { RunResults } from "../../../lib/runs/types";
import { syntheticBook } from "../../unit/risk/portfolio/synthetic-book";

const POSITIONS = 200_000;
const PARSES = 3;

const method: MonthEndMethod = {
  methods: ["parametric", "historical"],
  historicalWindow: 500,
  stressWindow: "search",
  historyDays: 60,
  backtestDays: 250,
};

const book = syntheticBook(200, 800, POSITIONS, 2026);
const t0 = performance.now();
const monthEnd = runMonthEnd({ positions: book.positions, returns: book.returns, reportingCurrency: "USD", method });
const engineMs = performance.now() - t0;
// only monthEnd is what grows with the book; the other parts of RunResults are the same size whatever the book
const results = { monthEnd } as RunResults;

function parseMs(json: string): number[] {
  const times: number[] = [];
  for (let i = 0; i < PARSES; i++) {
    (globalThis as { gc?: () => void }).gc?.();
    const t = performance.now();
    JSON.parse(json);
    times.push(performance.now() - t);
  }
  return times;
}

const whole = JSON.stringify(results);
const split = splitDetail(results);
const figures = JSON.stringify(split.figures);
const detailJson = JSON.stringify(split.detail);
const tz = performance.now();
const gz = gzipSync(Buffer.from(detailJson, "utf8"), { level: 1 }); // as packDetail (lib/data/runs.ts)
const gzipMs = performance.now() - tz;
const wholeParse = parseMs(whole);
const figuresParse = parseMs(figures);
const MiB = (n: number) => Math.round((n / 1048576) * 10) / 10;

emit({ name: "run-read-whole-results", value: median(wholeParse), unit: "ms", runs: PARSES, positions: POSITIONS, jsonMiB: MiB(whole.length), engineMs: Math.round(engineMs), what: "JSON.parse of the whole month-end results, as a read of the run parsed them before" });
emit({ name: "run-read-figures-only", value: median(figuresParse), unit: "ms", runs: PARSES, positions: POSITIONS, jsonMiB: MiB(figures.length), what: "JSON.parse of the figures without the per-position detail: what the run page, lists and filing checks read now" });
emit({ name: "run-detail-gzip", value: gzipMs, unit: "ms", runs: 1, positions: POSITIONS, jsonMiB: MiB(detailJson.length), gzipMiB: MiB(gz.length), what: "the detail row written once at the run's completion" });
