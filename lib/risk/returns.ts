/**
 * Returns from prices, and several price series aligned on dates. Returns are decimals unless the caller
 * asks for percent. A missing price is never treated as zero: the caller chooses what happens, and is told.
 */

/** Options of the return functions. */
export interface ReturnOptions {
  /** multiply by 100 (percent returns); decimals by default */
  percent?: boolean;
}

function checkPrices(prices: ArrayLike<number>, name: string): void {
  if (prices.length < 2) throw new RangeError(`${name} requires at least 2 prices`);
  for (let i = 0; i < prices.length; i++) {
    const p = prices[i];
    if (!(Number.isFinite(p) && p > 0)) throw new RangeError(`${name} requires positive prices: price ${i} is ${p}`);
  }
}

/** Log returns ln(pᵢ/pᵢ₋₁), oldest first; one fewer than the prices. @throws {RangeError} on a non-positive price */
export function logReturns(prices: ArrayLike<number>, options: ReturnOptions = {}): number[] {
  checkPrices(prices, "logReturns");
  const scale = options.percent ? 100 : 1;
  const out = new Array<number>(prices.length - 1);
  for (let i = 1; i < prices.length; i++) out[i - 1] = scale * Math.log(prices[i] / prices[i - 1]);
  return out;
}

/** Simple returns pᵢ/pᵢ₋₁ − 1, oldest first; one fewer than the prices. @throws {RangeError} on a non-positive price */
export function simpleReturns(prices: ArrayLike<number>, options: ReturnOptions = {}): number[] {
  checkPrices(prices, "simpleReturns");
  const scale = options.percent ? 100 : 1;
  const out = new Array<number>(prices.length - 1);
  for (let i = 1; i < prices.length; i++) out[i - 1] = scale * (prices[i] / prices[i - 1] - 1);
  return out;
}

/** One dated series to align: ISO yyyy-mm-dd dates and their values (NaN marks a missing value). */
export interface DatedSeries {
  id: string;
  dates: readonly string[];
  values: ArrayLike<number>;
}

/** What to do with a date on which some series has no value. */
export type MissingRule = "drop" | "carry-forward" | "refuse";

/** Options of alignSeries. */
export interface AlignOptions {
  missing: MissingRule;
  /** with "carry-forward": how many consecutive dates a last value may be carried (default 5) */
  carryLimit?: number;
}

/** A value carried forward on a date where its series had none. */
export interface CarriedPoint {
  date: string;
  id: string;
  /** the date whose value was carried */
  fromDate: string;
}

/** A date left out of the aligned result, and why. */
export interface DroppedDate {
  date: string;
  missingIds: string[];
  reason: "missing" | "beyond-carry-limit" | "no-earlier-value";
}

/** Every choice alignSeries made. */
export interface AlignReport {
  missing: MissingRule;
  carryLimit: number | null;
  unionDates: number;
  keptDates: number;
  dropped: DroppedDate[];
  carried: CarriedPoint[];
  /** per series: how many of its own dates it had, and how many of the kept values were carried */
  perSeries: Record<string, { observed: number; carried: number }>;
}

/** The aligned series: common dates and one value array per id, plus the report. */
export interface AlignedSeries {
  dates: string[];
  values: Record<string, number[]>;
  report: AlignReport;
}

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/**
 * Align several dated series on the union of their dates; a missing value is dropped, carried forward
 * (up to carryLimit dates, flagged) or refused, as the caller chooses, and every choice is reported.
 * @throws {Error} on a malformed or repeated date, or with "refuse" on the first missing value
 */
export function alignSeries(series: readonly DatedSeries[], options: AlignOptions): AlignedSeries {
  const { missing } = options;
  const carryLimit = options.carryLimit ?? 5;
  if (!(Number.isInteger(carryLimit) && carryLimit >= 0)) throw new RangeError("alignSeries requires a non-negative integer carryLimit");
  if (series.length === 0) throw new RangeError("alignSeries requires at least one series");
  const maps = new Map<string, Map<string, number>>();
  const all = new Set<string>();
  for (const s of series) {
    if (maps.has(s.id)) throw new Error(`alignSeries: series id "${s.id}" appears twice`);
    if (s.dates.length !== s.values.length) throw new Error(`alignSeries: series "${s.id}" has ${s.dates.length} dates but ${s.values.length} values`);
    const m = new Map<string, number>();
    for (let i = 0; i < s.dates.length; i++) {
      const d = s.dates[i];
      if (!ISO_DATE.test(d)) throw new Error(`alignSeries: series "${s.id}" row ${i}: date "${d}" is not yyyy-mm-dd`);
      if (m.has(d)) throw new Error(`alignSeries: series "${s.id}" has the date ${d} twice`);
      const v = s.values[i];
      if (Number.isFinite(v)) m.set(d, v);
      all.add(d);
    }
    maps.set(s.id, m);
  }
  const union = [...all].sort();
  const ids = series.map((s) => s.id);
  const dates: string[] = [];
  const values: Record<string, number[]> = Object.fromEntries(ids.map((id) => [id, [] as number[]]));
  const dropped: DroppedDate[] = [];
  const carried: CarriedPoint[] = [];
  const perSeries: AlignReport["perSeries"] = Object.fromEntries(ids.map((id) => [id, { observed: maps.get(id)!.size, carried: 0 }]));
  // last observed value per series, its date, and how many union dates it has been carried over
  const last = new Map<string, { value: number; date: string; run: number }>();

  for (const date of union) {
    const missingIds = ids.filter((id) => !maps.get(id)!.has(date));
    if (missingIds.length > 0 && missing === "refuse") {
      throw new Error(`alignSeries: series "${missingIds[0]}" has no value on ${date} (missing: "refuse")`);
    }
    let keep = missingIds.length === 0;
    let reason: DroppedDate["reason"] = "missing";
    if (!keep && missing === "carry-forward") {
      keep = true;
      for (const id of missingIds) {
        const prev = last.get(id);
        if (!prev) { keep = false; reason = "no-earlier-value"; break; }
        if (prev.run + 1 > carryLimit) { keep = false; reason = "beyond-carry-limit"; break; }
      }
    }
    // update the carry counters whatever happens on this date
    for (const id of ids) {
      const v = maps.get(id)!.get(date);
      if (v !== undefined) last.set(id, { value: v, date, run: 0 });
      else { const prev = last.get(id); if (prev) prev.run++; }
    }
    if (!keep) { dropped.push({ date, missingIds, reason }); continue; }
    dates.push(date);
    for (const id of ids) {
      const v = maps.get(id)!.get(date);
      if (v !== undefined) values[id].push(v);
      else {
        const prev = last.get(id)!;
        values[id].push(prev.value);
        carried.push({ date, id, fromDate: prev.date });
        perSeries[id].carried++;
      }
    }
  }
  return {
    dates,
    values,
    report: { missing, carryLimit: missing === "carry-forward" ? carryLimit : null, unionDates: union.length, keptDates: dates.length, dropped, carried, perSeries },
  };
}
