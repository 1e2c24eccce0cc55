/**
 * Month-end run on synthetic data (invented instruments): N instruments × 1,000 days, 5,000 positions,
 * GARCH(1,1) per factor with constant correlation, parametric and historical VaR/ES at 1 and 10 days,
 * component VaR, stressed-window search, 60-day VaR history and a 250-day backtest — exactly runMonthEnd.
 * Targets (issue 4): 500 × 1,000 ≤ 5 s wall, ≤ 1 GiB peak memory on the 2-core machine.
 */
import { performance } from "node:perf_hooks";
import { emit, median } from "../emit";
import { runMonthEnd } from "../../../lib/risk/portfolio/run-month-end";
import { syntheticBook } from "../../unit/risk/portfolio/synthetic-book";

const sizes: [number, number][] = [
  [50, 3],
  [500, 3],
  [2000, 1],
];

function measure(instruments: number, runs: number): number[] {
  const book = syntheticBook(instruments, 1000, 5000, 2026);
  const times: number[] = [];
  for (let r = 0; r < runs; r++) {
    (globalThis as { gc?: () => void }).gc?.();
    const t0 = performance.now();
    const result = runMonthEnd({
      positions: book.positions,
      returns: book.returns,
      reportingCurrency: "USD",
      method: { methods: ["parametric", "historical"], covariance: "garch-ccc", historicalWindow: 500, stressWindow: "search" },
    });
    times.push(performance.now() - t0);
    if (!(result.methods[0].byConfidence[0].oneDay.var > 0)) throw new Error("month-end run produced no VaR");
  }
  return times;
}

for (const [instruments, runs] of sizes) {
  const times = measure(instruments, runs);
  emit({ name: `month-end-run-${instruments}x1000`, value: median(times), unit: "ms", runs, positions: 5000, days: 1000, all: times.map((t) => Math.round(t)) });
  if (instruments === 500) {
    // peak resident memory of this process so far (it has run only the 50 and 500 cases)
    emit({ name: "month-end-run-500x1000-rss", value: process.resourceUsage().maxRSS / 1024, unit: "MiB", runs: 1 });
  }
}
