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

/** A date some series lacks: "drop" it, "carry-forward" the last value, "refuse", or "drop-inside-history" (the runs' rule: drop only inside a series' own history, NaN outside it). */
export type MissingRule = "drop" | "carry-forward" | "refuse" | "drop-inside-history";

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

/** A date left out of the aligned result, and why ("drop-inside-history": missingIds are the series without a value inside their own history). */
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
  /**
   * per series: how many of its own dates it had, how many of the kept values were carried, and how many kept dates
   * fall outside its own history (NaN there; only with "drop-inside-history")
   */
  perSeries: Record<string, { observed: number; carried: number; outsideHistory: number }>;
}

/** The aligned series: common dates and one value array per id, plus the report. */
export interface AlignedSeries {
  dates: string[];
  values: Record<string, number[]>;
  report: AlignReport;
}

/** Series already on one date axis (oldest first): each series' values on every axis date, NaN where it has none. */
export interface SeriesOnAxis {
  id: string;
  values: ArrayLike<number>;
}

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

function checkCarryLimit(options: AlignOptions): number {
  const carryLimit = options.carryLimit ?? 5;
  if (!(Number.isInteger(carryLimit) && carryLimit >= 0)) throw new RangeError("alignSeries requires a non-negative integer carryLimit");
  return carryLimit;
}

/** Align dated series on the union of their dates under the caller's MissingRule, reporting every choice. @throws {Error} on a malformed or repeated date, or with "refuse" on the first missing value */
export function alignSeries(series: readonly DatedSeries[], options: AlignOptions): AlignedSeries {
  checkCarryLimit(options);
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
  return alignOnAxis(union, series.map((s) => {
    const m = maps.get(s.id)!;
    return { id: s.id, values: union.map((d) => m.get(d) ?? NaN) };
  }), options);
}

/** alignSeries's kernel for series already on one date axis (taken as given; non-finite = missing; no series allowed). @throws {Error} with "refuse" on the first missing value */
export function alignOnAxis(axis: readonly string[], series: readonly SeriesOnAxis[], options: AlignOptions): AlignedSeries {
  const { missing } = options;
  const carryLimit = checkCarryLimit(options);
  const n = axis.length;
  const ids = series.map((s) => s.id);
  const has = (s: SeriesOnAxis, t: number) => Number.isFinite(s.values[t]);
  // each series' own history: the axis positions of its first and last values (-1 when it has none)
  const first: number[] = [];
  const lastSeen: number[] = [];
  const perSeries: AlignReport["perSeries"] = {};
  for (const s of series) {
    if (s.values.length !== n) throw new Error(`alignSeries: series "${s.id}" has ${s.values.length} values on an axis of ${n} dates`);
    let f = -1;
    let l = -1;
    let observed = 0;
    for (let t = 0; t < n; t++) {
      if (!has(s, t)) continue;
      if (f < 0) f = t;
      l = t;
      observed++;
    }
    first.push(f);
    lastSeen.push(l);
    perSeries[s.id] = { observed, carried: 0, outsideHistory: 0 };
  }
  const dates: string[] = [];
  const values: Record<string, number[]> = Object.fromEntries(ids.map((id) => [id, [] as number[]]));
  const dropped: DroppedDate[] = [];
  const carried: CarriedPoint[] = [];
  // last observed value per series, its date, and how many axis dates it has been carried over
  const last: ({ value: number; date: string; run: number } | undefined)[] = series.map(() => undefined);

  for (let t = 0; t < n; t++) {
    const date = axis[t];
    const absent: number[] = [];
    for (let k = 0; k < series.length; k++) if (!has(series[k], t)) absent.push(k);
    if (absent.length > 0 && missing === "refuse") {
      throw new Error(`alignSeries: series "${ids[absent[0]]}" has no value on ${date} (missing: "refuse")`);
    }
    // the series whose absence drops the date: with "drop-inside-history" only those inside their own history
    const blocking = missing === "drop-inside-history" ? absent.filter((k) => first[k] >= 0 && t >= first[k] && t <= lastSeen[k]) : absent;
    let keep = blocking.length === 0;
    let reason: DroppedDate["reason"] = "missing";
    if (!keep && missing === "carry-forward") {
      keep = true;
      for (const k of absent) {
        const prev = last[k];
        if (!prev) { keep = false; reason = "no-earlier-value"; break; }
        if (prev.run + 1 > carryLimit) { keep = false; reason = "beyond-carry-limit"; break; }
      }
    }
    // update the carry counters whatever happens on this date
    for (let k = 0; k < series.length; k++) {
      if (has(series[k], t)) last[k] = { value: series[k].values[t], date, run: 0 };
      else { const prev = last[k]; if (prev) prev.run++; }
    }
    if (!keep) { dropped.push({ date, missingIds: blocking.map((k) => ids[k]), reason }); continue; }
    dates.push(date);
    for (let k = 0; k < series.length; k++) {
      const id = ids[k];
      if (has(series[k], t)) values[id].push(series[k].values[t]);
      else if (missing === "drop-inside-history") {
        values[id].push(NaN);
        perSeries[id].outsideHistory++;
      } else {
        const prev = last[k]!;
        values[id].push(prev.value);
        carried.push({ date, id, fromDate: prev.date });
        perSeries[id].carried++;
      }
    }
  }
  return {
    dates,
    values,
    report: { missing, carryLimit: missing === "carry-forward" ? carryLimit : null, unionDates: n, keptDates: dates.length, dropped, carried, perSeries },
  };
}

/** Log returns of aligned series between consecutive kept dates, with each series' unbroken returns up to the last date. */
export interface AlignedReturns {
  /** the date each return ends on: the kept dates but the first */
  dates: string[];
  /** ln(pₜ/pₜ₋₁) per series; NaN where either value is missing or not positive */
  returns: Record<string, Float64Array>;
  /** per series: how many returns up to the last date without a break (NaN) */
  unbroken: Record<string, number>;
}

/** Log returns between consecutive aligned dates (NaN where either value is missing or not positive), and each series' unbroken run up to the last date. */
export function alignedLogReturns(aligned: Pick<AlignedSeries, "dates" | "values">): AlignedReturns {
  const m = aligned.dates.length;
  const returns: Record<string, Float64Array> = {};
  const unbroken: Record<string, number> = {};
  for (const [id, v] of Object.entries(aligned.values)) {
    const r = new Float64Array(Math.max(0, m - 1));
    for (let i = 1; i < m; i++) {
      const a = v[i - 1];
      const b = v[i];
      r[i - 1] = a > 0 && b > 0 ? Math.log(b / a) : NaN;
    }
    returns[id] = r;
    let run = 0;
    for (let t = r.length - 1; t >= 0 && Number.isFinite(r[t]); t--) run++;
    unbroken[id] = run;
  }
  return { dates: aligned.dates.slice(1), returns, unbroken };
}
