/**
 * Standardised building-block benchmark (one JSON line):
 *   standardised-5000  median ms of computeStandardised (validation included) on 5,000 seeded positions across four
 *                      currencies touching every block: bonds and bills (dated and in years, fixed and floating, all
 *                      issuer categories), bond futures, swaps, equities on four markets, commodities, currency and
 *                      gold positions, bought options with and without a hedge; maturity method, after warm-up
 */
import { emit, median } from "../emit";
import { computeStandardised, mulberry32, type StandardisedPosition } from "../../../lib/risk";

const rng = mulberry32(14_2026);
const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rng() * xs.length)];
const CCYS = ["EUR", "USD", "GBP", "JPY"] as const;
const MARKETS = ["DE", "US", "UK", "JP"] as const;
const CATEGORIES = ["government", "qualifying", "other"] as const;
const signed = (scale: number) => (rng() < 0.7 ? 1 : -1) * scale * (0.2 + rng());

const positions: StandardisedPosition[] = [];
for (let i = 0; i < 5000; i++) {
  const k = i % 20;
  const c = CCYS[i % 4];
  if (k < 8) {
    const bill = k === 7;
    const dated = k % 2 === 0;
    const years = bill ? rng() : rng() * 30;
    const p: StandardisedPosition = {
      instrument: `${bill ? "BILL" : "BOND"}-${i % 700}`,
      instrumentType: bill ? "bill" : "bond",
      currency: c,
      marketValue: signed(1e6),
      issuerCategory: pick(CATEGORIES),
      coupon: bill ? 0 : Math.round(rng() * 80) / 10,
    };
    if (dated) {
      const d = new Date(Date.UTC(2026, 10, 30) + Math.floor(1 + years * 365.25) * 86_400_000);
      p.maturityDate = d.toISOString().slice(0, 10);
    } else p.residualMaturityYears = years;
    if (k === 5) p.nextResetYears = rng() * 0.5;
    positions.push(p);
  } else if (k === 8) {
    positions.push({ instrument: `FUT-${i}`, instrumentType: "future", assetClass: "government_bond", currency: c, marketValue: signed(1e4), notional: signed(5e6), residualMaturityYears: rng() * 0.75, underlyingMaturityYears: 5 + rng() * 10, coupon: 6, issuerCategory: "government" });
  } else if (k === 9) {
    positions.push({ instrument: `SWAP-${i}`, instrumentType: "swap", currency: c, marketValue: signed(1e4), notional: signed(1e7), residualMaturityYears: 1 + rng() * 20, coupon: rng() * 5, nextResetYears: rng() * 0.5 });
  } else if (k < 15) {
    positions.push({ instrument: `EQ-${i % 900}`, instrumentType: k === 14 ? "fund" : "equity", currency: c, nationalMarket: MARKETS[i % 4], marketValue: signed(5e5) });
  } else if (k === 15) {
    positions.push({ instrument: `CMD-${i}`, instrumentType: "commodity", commodity: pick(["copper", "oil", "wheat", "silver"]), currency: "USD", marketValue: signed(2e5) });
  } else if (k === 16) {
    positions.push({ instrument: `CCY-${i}`, instrumentType: "currency", currency: pick(["USD", "GBP", "JPY", "CHF"]), marketValue: signed(3e5) });
  } else if (k === 17) {
    positions.push({ instrument: `GOLD-${i}`, instrumentType: "gold", currency: "USD", marketValue: signed(1e5) });
  } else {
    // a bought put on a long equity (hedged where the underlying is long) or a bought call
    const underlying = `EQ-${(i - 8) % 900}`;
    positions.push({ instrument: `OPT-${i}`, instrumentType: "option", assetClass: "equity", currency: c, marketValue: 1000 + rng() * 4000, underlying, optionKind: k === 18 ? "put" : "call", strike: 90 + rng() * 20, quantity: 100 + Math.floor(rng() * 900), underlyingPrice: 100 });
  }
}

const options = { reportingCurrency: "EUR", asOf: "2026-11-30" };
let result = computeStandardised(positions, options);
for (let r = 0; r < 20; r++) result = computeStandardised(positions, options);
const times: number[] = [];
for (let r = 0; r < 51; r++) {
  const t0 = performance.now();
  result = computeStandardised(positions, options);
  times.push(performance.now() - t0);
}
emit({
  name: "standardised-5000",
  value: +median(times).toFixed(3),
  unit: "ms",
  runs: times.length,
  target: 50,
  positions: positions.length,
  currencies: result.interestRate.byCurrency.length,
  markets: result.equity.byMarket.length,
  options: result.options.length,
  hedged: result.options.filter((o) => o.treatment === "hedged").length,
  blocksNonZero: Object.values(result.blocks).filter((v) => v > 0).length,
  note: "validation included; maturity method; in-process after 20 warm-up runs",
});
