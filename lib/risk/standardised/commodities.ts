/**
 * Commodity risk per commodity, at spot value in the reporting currency. Simplified approach: 15 % of |net| plus
 * 3 % of the gross position (long + |short|); maturities play no part. Maturity ladder (where the profile asks):
 * per band, matched long and short attract the spread rate on both sides; unmatched amounts carried to a later
 * band to offset there attract the carry rate per band moved; what is left is charged at the outright rate.
 */
import { EDGE_EPSILON } from "./interest-rate-general";
import type { CommodityResult, StandardisedProfile } from "./types";

/** One commodity holding: the commodity, signed spot value, and (ladder only) residual maturity in years. */
export interface CommodityHolding {
  commodity: string;
  amount: number;
  years?: number;
}

function ladderLabel(edges: readonly (number | null)[], i: number): string {
  const fmt = (y: number) => (y < 1 - EDGE_EPSILON ? `${Math.round(y * 12)} m` : `${Number(y.toFixed(4))} y`);
  const lo = i === 0 ? 0 : (edges[i - 1] ?? 0);
  const hi = edges[i];
  if (hi === null) return `> ${fmt(lo)}`;
  return i === 0 ? `≤ ${fmt(hi)}` : `${fmt(lo)}–${fmt(hi)}`;
}

/**
 * The commodity maturity-ladder charge of one commodity's holdings (from memory of the 1996 amendment's
 * ladder: spread 1.5 %, carry 0.6 % per band, outright 15 %).
 * @example commodityLadder([{ commodity: "x", amount: 100, years: 0.1 }, { commodity: "x", amount: -100, years: 0.1 }], rules.ladder).charge // → 3
 */
export function commodityLadder(holdings: readonly CommodityHolding[], rules: StandardisedProfile["commodities"]["ladder"]): Pick<CommodityResult, "ladder" | "charge" | "netCharge"> {
  const edges = rules.upToYears;
  const bands = edges.map((_, i) => ({ band: ladderLabel(edges, i), long: 0, short: 0, matched: 0, spreadCharge: 0, carried: 0, carryCharge: 0 }));
  for (const h of holdings) {
    const y = h.years ?? 0;
    let i = edges.findIndex((e) => e === null || y <= e + EDGE_EPSILON);
    if (i < 0) i = edges.length - 1;
    if (h.amount >= 0) bands[i].long += h.amount;
    else bands[i].short += h.amount;
  }
  // open chunks carried forward: signed amount and the band they came from
  const open: { amount: number; from: number }[] = [];
  for (let i = 0; i < bands.length; i++) {
    const b = bands[i];
    b.matched = Math.min(b.long, -b.short);
    b.spreadCharge = 2 * b.matched * rules.spreadRate;
    let rest = b.long + b.short;
    // offset against what nearer bands carried (nearest first), charging spread on both sides and carry per band moved
    for (let k = open.length - 1; k >= 0 && rest !== 0; k--) {
      const c = open[k];
      if (c.amount * rest >= 0) continue;
      const m = Math.min(Math.abs(c.amount), Math.abs(rest));
      b.spreadCharge += 2 * m * rules.spreadRate;
      const carryCharge = m * rules.carryRate * (i - c.from);
      bands[c.from].carried += m;
      bands[c.from].carryCharge += carryCharge;
      c.amount -= Math.sign(c.amount) * m;
      rest -= Math.sign(rest) * m;
      if (c.amount === 0) open.splice(k, 1);
    }
    if (rest !== 0) open.push({ amount: rest, from: i });
  }
  let residual = 0;
  for (const c of open) residual += c.amount;
  const netCharge = Math.abs(residual) * rules.outrightRate;
  let charge = netCharge;
  for (const b of bands) charge += b.spreadCharge + b.carryCharge;
  return { ladder: bands, charge, netCharge };
}

/**
 * Commodity charge per commodity under the profile's method.
 * @example commodityRisk([{ commodity: "copper", amount: 2720 }, { commodity: "copper", amount: -3400 }], rules)[0].charge // → 285.6 (15 % × 680 + 3 % × 6,120)
 */
export function commodityRisk(holdings: readonly CommodityHolding[], rules: StandardisedProfile["commodities"]): CommodityResult[] {
  const by = new Map<string, CommodityHolding[]>();
  for (const h of holdings) {
    const list = by.get(h.commodity);
    if (list) list.push(h);
    else by.set(h.commodity, [h]);
  }
  return [...by.keys()].sort().map((commodity) => {
    const list = by.get(commodity)!;
    let long = 0;
    let short = 0;
    for (const h of list) {
      if (h.amount >= 0) long += h.amount;
      else short += h.amount;
    }
    const net = long + short;
    const gross = long - short;
    if (rules.method === "maturity") {
      const l = commodityLadder(list, rules.ladder);
      return { commodity, method: "maturity", long, short, net, gross, netCharge: l.netCharge, grossCharge: 0, ladder: l.ladder, charge: l.charge };
    }
    const netCharge = Math.abs(net) * rules.netRate;
    const grossCharge = gross * rules.grossRate;
    return { commodity, method: "simplified", long, short, net, gross, netCharge, grossCharge, charge: netCharge + grossCharge };
  });
}
