/** A synthetic book for tests and the bench: invented instruments, seeded returns with a calm–stress–calm path. */
import { mulberry32, normalSampler } from "@/lib/risk/random";
import type { Position } from "@/lib/risk/portfolio/exposures";
import type { FactorReturns, MonthEndInput, MonthEndMethod } from "@/lib/risk/portfolio/run-month-end";

export interface SyntheticBook {
  positions: Position[];
  returns: FactorReturns;
}

/** Business-day dates from 2022-01-03, skipping weekends. */
export function businessDates(n: number): string[] {
  const out: string[] = [];
  const d = new Date(Date.UTC(2022, 0, 3));
  while (out.length < n) {
    const day = d.getUTCDay();
    if (day !== 0 && day !== 6) out.push(d.toISOString().slice(0, 10));
    d.setUTCDate(d.getUTCDate() + 1);
  }
  return out;
}

/**
 * `instruments` price factors driven by one market factor plus noise, with GARCH-like clustering and a
 * stressed stretch (days 35 %–55 % of the sample at three times the volatility), plus a EURUSD factor;
 * `positionsCount` positions spread over the instruments, three asset classes, two currencies.
 */
export function syntheticBook(instruments: number, days: number, positionsCount: number, seed = 1): SyntheticBook {
  const rng = mulberry32(seed);
  const normal = normalSampler(rng);
  const dates = businessDates(days);
  const market = new Float64Array(days);
  const fx = new Float64Array(days);
  let h = 1e-4;
  for (let t = 0; t < days; t++) {
    const stress = t > days * 0.35 && t < days * 0.55 ? 3 : 1;
    const u = Math.sqrt(h) * normal() * stress;
    market[t] = u;
    h = 2e-6 + 0.08 * (u / stress) ** 2 + 0.9 * h;
    fx[t] = 0.005 * normal() * (stress > 1 ? 1.5 : 1);
  }
  const factors: Record<string, Float64Array> = { EURUSD: fx };
  for (let i = 0; i < instruments; i++) {
    const beta = 0.5 + rng();
    const idio = 0.005 + 0.01 * rng();
    const r = new Float64Array(days);
    for (let t = 0; t < days; t++) r[t] = beta * market[t] + idio * normal();
    factors[`INST${String(i).padStart(4, "0")}`] = r;
  }
  const classes = ["equity", "bond", "fund"];
  const positions: Position[] = [];
  for (let j = 0; j < positionsCount; j++) {
    const i = j % instruments;
    const mv = (rng() < 0.15 ? -1 : 1) * Math.round(10000 + 990000 * rng());
    positions.push({
      instrument: `INST${String(i).padStart(4, "0")}`,
      assetClass: classes[i % 3],
      currency: i % 4 === 0 ? "EUR" : "USD",
      marketValue: mv,
    });
  }
  return { positions, returns: { dates, factors } };
}

/** The book as the engine's month-end input, in USD, under `method` (the engine's defaults when none). */
export function bookInput(book: Pick<SyntheticBook, "positions" | "returns">, method?: MonthEndMethod): MonthEndInput {
  return { positions: book.positions, returns: book.returns, reportingCurrency: "USD", ...(method ? { method } : {}) };
}
