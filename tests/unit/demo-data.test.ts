/**
 * The committed demo files (templates/demo/): the planted problems are where the README says, the positions files
 * pass the upload validation, the generator reproduces the files byte for byte, and the stress episode shows.
 */
import { afterAll, describe, expect, it } from "vitest";
import { mkdtempSync, readFileSync, readdirSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import {
  BAD_ROWS,
  LAST_DAY,
  MAIN_PRICES_END,
  NOK_EUR_RATE,
  NORTHMOOR_ADDED_SERIES,
  NORTHMOOR_SERIES,
  NOVEMBER_AS_OF,
  OCTOBER_AS_OF,
  PLANTED,
  POSITIONS_HEADER,
  STRESS,
  businessDays,
  generateDemoData,
} from "../../scripts/generate-demo-data";
import { readCsvText } from "@/lib/uploads/read-table";
import { POSITION_FIELDS, parsePositions, type PositionRow } from "@/lib/uploads/parse-positions";
import { checkSeries, dataQualityReport } from "@/lib/uploads/data-quality";
import { searchStressWindow } from "@/lib/risk/var/stressed";
import { STANDARDISED_1996_PROFILE, computeStandardised } from "@/lib/risk/standardised";
import { standardisedPositionOf } from "@/lib/uploads/position-attributes";

const DEMO = path.resolve(__dirname, "../../templates/demo");
const text = (file: string) => readFileSync(path.join(DEMO, file), "utf8");
const raw = (file: string) => readCsvText(text(file));
const table = (file: string) => {
  const t = raw(file);
  return { header: t.header, rows: t.rows.map((r) => r.map((c) => String(c))) };
};

type Series = { dates: string[]; closes: number[]; raw: string[] };

/** Long price files into series by instrument; a later file's row for an existing date replaces it (a correction). */
function loadSeries(...files: string[]): Map<string, Series> {
  const out = new Map<string, Series>();
  for (const file of files) {
    for (const [date, instrument, close] of table(file).rows) {
      const s = out.get(instrument) ?? { dates: [], closes: [], raw: [] };
      const at = s.dates.indexOf(date);
      if (at >= 0) {
        s.closes[at] = Number(close);
        s.raw[at] = close;
      } else {
        s.dates.push(date);
        s.closes.push(Number(close));
        s.raw.push(close);
      }
      out.set(instrument, s);
    }
  }
  return out;
}

const main = loadSeries("northmoor-prices.csv");
const all = loadSeries("northmoor-prices.csv", "northmoor-prices-extension.csv");
const novemberTable = table("northmoor-positions-2026-11.csv");
const DAYS = businessDays("2023-01-02", LAST_DAY);
const MAIN_DAYS = DAYS.filter((d) => d <= MAIN_PRICES_END);

function fxOn(series: Map<string, Series>, reporting: string, day: string): Record<string, number> {
  const rates: Record<string, number> = {};
  for (const [id, s] of series) {
    if (/^[A-Z]{6}$/.test(id) && id.endsWith(reporting)) rates[id.slice(0, 3)] = s.closes[s.dates.indexOf(day)];
  }
  return rates;
}

function positions(file: string, reporting: string, asOf: string, series: Map<string, Series>, filesStandardised = false): { rows: PositionRow[]; problems: unknown[] } {
  const fx = fxOn(series, reporting, asOf);
  if (reporting === "EUR") fx.NOK = NOK_EUR_RATE;
  return parsePositions(raw(file), { numberFormat: "plain" }, {
    today: "2026-12-01",
    reportingCurrency: reporting,
    periodEnd: asOf,
    fxToReporting: fx,
    ...(filesStandardised ? { filedStandardisedProfile: STANDARDISED_1996_PROFILE } : {}),
  });
}

describe("committed demo files", () => {
  it("are CSV with LF line ends, no BOM, and the expected headers", () => {
    for (const file of readdirSync(DEMO).filter((f) => f.endsWith(".csv"))) {
      const content = text(file);
      expect(content.includes("\r"), file).toBe(false);
      expect(content.charCodeAt(0), file).not.toBe(0xfeff);
      expect(content.endsWith("\n"), file).toBe(true);
      const header = content.slice(0, content.indexOf("\n"));
      expect(header, file).toBe(file.includes("prices") ? "date,instrument,close" : POSITIONS_HEADER.join(","));
    }
  });

  it("northmoor-prices.csv holds every business day to 2026-11-20 for every series but the planted gap", () => {
    expect(main.size).toBe(NORTHMOOR_SERIES.length + NORTHMOOR_ADDED_SERIES.length);
    expect(main.size).toBe(53);
    for (const [id, s] of main) {
      const expected = id === PLANTED.gap.instrument ? MAIN_DAYS.filter((d) => d < PLANTED.gap.from || d > PLANTED.gap.to) : MAIN_DAYS;
      expect(s.dates, id).toEqual(expected);
    }
    expect([...main.keys()].some((id) => id.startsWith("NOK"))).toBe(false);
  });

  it("has a stale run of exactly 7 business days where the README says", () => {
    const s = main.get(PLANTED.stale.instrument)!;
    const from = s.dates.indexOf(PLANTED.stale.from), to = s.dates.indexOf(PLANTED.stale.to);
    expect(to - from + 1).toBe(PLANTED.stale.days);
    expect(new Set(s.raw.slice(from, to + 1)).size).toBe(1);
    expect(s.raw[from - 1]).not.toBe(s.raw[from]);
    expect(s.raw[to + 1]).not.toBe(s.raw[to]);
  });

  it("has a gap of exactly 12 business days where the README says", () => {
    const s = main.get(PLANTED.gap.instrument)!;
    const missing = MAIN_DAYS.filter((d) => !s.dates.includes(d));
    expect(missing.length).toBe(PLANTED.gap.days);
    expect(missing[0]).toBe(PLANTED.gap.from);
    expect(missing.at(-1)).toBe(PLANTED.gap.to);
    expect(MAIN_DAYS.indexOf(PLANTED.gap.to) - MAIN_DAYS.indexOf(PLANTED.gap.from) + 1).toBe(12); // consecutive
  });

  it("has a one-day jump of about +35 % that reverts the next day", () => {
    const s = main.get(PLANTED.jump.instrument)!;
    const i = s.dates.indexOf(PLANTED.jump.date);
    expect(s.closes[i] / s.closes[i - 1]).toBeGreaterThan(1.25);
    expect(s.closes[i + 1] / s.closes[i]).toBeLessThan(0.8);
    expect(Math.abs(Math.log(s.closes[i + 1] / s.closes[i - 1]))).toBeLessThan(0.1);
  });

  it("the extension covers 2026-11-23 to 2026-11-30 for every series and corrects one close of 2026-11-20", () => {
    const ext = table("northmoor-prices-extension.csv").rows;
    const days = DAYS.filter((d) => d > MAIN_PRICES_END);
    expect(days).toEqual(["2026-11-23", "2026-11-24", "2026-11-25", "2026-11-26", "2026-11-27", "2026-11-30"]);
    for (const id of main.keys()) expect(ext.filter((r) => r[1] === id && r[0] > MAIN_PRICES_END).map((r) => r[0]), id).toEqual(days);
    const corrections = ext.filter((r) => r[0] <= MAIN_PRICES_END);
    expect(corrections).toHaveLength(1);
    const [date, id, close] = corrections[0];
    expect([date, id]).toEqual([PLANTED.correction.date, PLANTED.correction.instrument]);
    const before = main.get(id)!.raw[main.get(id)!.dates.indexOf(date)];
    expect(close).not.toBe(before);
    expect(ext.length).toBe(main.size * days.length + 1);
  });

  it("the November positions: header, 45–70 rows, two or three books, shorts, the no-history and NOK positions", () => {
    expect(novemberTable.header).toEqual([...POSITIONS_HEADER]);
    const rows = novemberTable.rows;
    expect(rows.length).toBeGreaterThanOrEqual(45);
    expect(rows.length).toBeLessThanOrEqual(70);
    expect(new Set(rows.map((r) => r[0]))).toEqual(new Set([NOVEMBER_AS_OF]));
    const books = new Set(rows.map((r) => r[1]));
    expect(books.size).toBeGreaterThanOrEqual(2);
    expect(books.size).toBeLessThanOrEqual(3);
    expect(rows.filter((r) => Number(r[6]) < 0).length).toBeGreaterThanOrEqual(2);
    // futures (commodity futures and the bond future) carry a delta-equivalent exposure, nothing else does
    const type = POSITIONS_HEADER.indexOf("instrument_type");
    for (const r of rows) expect(r[9] !== "", r[2]).toBe(r[type] === "future");

    const noHistory = rows.filter((r) => r[2] === PLANTED.noHistory.instrument);
    expect(noHistory).toHaveLength(1);
    expect(all.has(PLANTED.noHistory.instrument)).toBe(false);

    const nok = rows.filter((r) => r[2] === PLANTED.missingFx.instrument);
    expect(nok).toHaveLength(1);
    expect(nok[0][5]).toBe("NOK");
    expect(all.has(PLANTED.missingFx.pair)).toBe(false);
    expect(Number(nok[0][8])).toBeCloseTo(Number(nok[0][6]) * Number(nok[0][7]) * NOK_EUR_RATE, 1);

    // Every other position is priced at its 2026-11-30 close.
    for (const r of rows) {
      if (r[2] === PLANTED.noHistory.instrument) continue;
      const s = all.get(r[2])!;
      expect(r[7], r[2]).toBe(s.raw[s.dates.indexOf(NOVEMBER_AS_OF)]);
    }
  });

  it("every good positions file passes the upload validation with no problem, market values included", () => {
    const pellam = loadSeries("pellam-prices.csv");
    const cases = [
      { file: "northmoor-positions-2026-11.csv", reporting: "EUR", asOf: NOVEMBER_AS_OF, series: all },
      { file: "northmoor-positions-2026-10.csv", reporting: "EUR", asOf: OCTOBER_AS_OF, series: all },
      { file: "pellam-positions-2026-11.csv", reporting: "GBP", asOf: NOVEMBER_AS_OF, series: pellam },
    ];
    for (const c of cases) {
      const parsed = positions(c.file, c.reporting, c.asOf, c.series);
      expect(parsed.problems, c.file).toEqual([]);
      expect(parsed.rows.length, c.file).toBe(table(c.file).rows.length);
    }
    expect(table("pellam-positions-2026-11.csv").rows.length).toBeGreaterThanOrEqual(8);
    expect(pellam.size).toBeGreaterThanOrEqual(8);
    expect(pellam.size).toBeLessThanOrEqual(12);
  });

  it("the November book holds what the standardised blocks need: bills and bonds over the ladder, a bond future, a swap, equities on several markets, commodities, currency positions", () => {
    const col = (name: (typeof POSITIONS_HEADER)[number]) => POSITIONS_HEADER.indexOf(name);
    const rows = novemberTable.rows;
    const ofType = (t: string) => rows.filter((r) => r[col("instrument_type")] === t);
    expect(ofType("bill").length).toBeGreaterThanOrEqual(3);
    expect(ofType("bond").length).toBeGreaterThanOrEqual(8);
    expect(new Set(ofType("bond").map((r) => r[col("issuer_category")]))).toEqual(new Set(["government", "qualifying", "other"]));
    expect(ofType("future").filter((r) => r[col("asset_class")] === "government_bond")).toHaveLength(1);
    expect(ofType("swap")).toHaveLength(1);
    expect(new Set(ofType("equity").map((r) => r[col("national_market")])).size).toBeGreaterThanOrEqual(2);
    expect(ofType("future").filter((r) => r[col("commodity")] !== "").length).toBeGreaterThanOrEqual(1);
    expect(ofType("currency").length).toBeGreaterThanOrEqual(2);
    // a firm filing the standardised figure can confirm the file as it stands
    const parsed = positions("northmoor-positions-2026-11.csv", "EUR", NOVEMBER_AS_OF, all, true);
    expect(parsed.problems).toEqual([]);
    // and the bills and bonds spread over the ladder: every zone of the EUR ladder holds a position
    const result = computeStandardised(
      parsed.rows.map((r) => standardisedPositionOf(r, "EUR")),
      { reportingCurrency: "EUR", asOf: NOVEMBER_AS_OF, profile: STANDARDISED_1996_PROFILE },
    );
    const eur = result.interestRate.byCurrency.find((c) => c.currency === "EUR")!;
    for (const zone of [1, 2, 3]) expect(eur.bands.filter((b) => b.zone === zone && (b.long !== 0 || b.short !== 0)).length, `zone ${zone}`).toBeGreaterThan(0);
    expect(result.equity.byMarket.length).toBeGreaterThanOrEqual(2);
    expect(result.fx.byCurrency.some((c) => c.fromCurrencyPositions !== 0)).toBe(true);
  });

  it("October differs from November by a few added, closed and resized positions", () => {
    const key = (r: string[]) => `${r[1]} ${r[2]}`;
    const oct = new Map(table("northmoor-positions-2026-10.csv").rows.map((r) => [key(r), r]));
    const nov = new Map(novemberTable.rows.map((r) => [key(r), r]));
    expect([...nov.keys()].filter((k) => !oct.has(k)).length).toBeGreaterThan(0);
    expect([...oct.keys()].filter((k) => !nov.has(k)).length).toBeGreaterThan(0);
    expect([...nov.keys()].filter((k) => oct.has(k) && oct.get(k)![6] !== nov.get(k)![6]).length).toBeGreaterThan(0);
    expect(new Set([...oct.values()].map((r) => r[0]))).toEqual(new Set([OCTOBER_AS_OF]));
  });

  it("the bad positions file gives exactly one error on each planted row and none on the others", () => {
    const parsed = positions("northmoor-positions-bad.csv", "EUR", NOVEMBER_AS_OF, all);
    const errors = parsed.problems.filter((p) => (p as { severity: string }).severity === "error") as { row: number; field: string }[];
    const label: Record<string, string> = {
      as_of: POSITION_FIELDS.asOf.label, instrument_id: POSITION_FIELDS.instrument.label, asset_class: POSITION_FIELDS.assetClass.label,
      currency: POSITION_FIELDS.currency.label, quantity: POSITION_FIELDS.quantity.label, price: POSITION_FIELDS.price.label,
    };
    for (const planted of BAD_ROWS) {
      const onRow = errors.filter((e) => e.row === planted.line);
      expect(onRow.map((e) => e.field), `line ${planted.line}: ${planted.note}`).toEqual(planted.error ? [label[planted.error]] : []);
    }
    // nine rows with an error; the formula-looking name is valid text
    expect(BAD_ROWS.filter((r) => r.error).length).toBe(9);
    expect(errors.length).toBe(9);
    const formula = parsed.rows.find((r) => r.instrumentName.startsWith("=HYPERLINK("));
    expect(formula?.instrument).toBe("NMB-EQ-KITTIWAKE");
  });

  it("the data-quality report finds the planted problems, and no stale run or gap elsewhere", () => {
    const rows = positions("northmoor-positions-2026-11.csv", "EUR", NOVEMBER_AS_OF, all).rows;
    const report = dataQualityReport(rows, all, { reportingCurrency: "EUR", periodEnd: NOVEMBER_AS_OF });
    const items = (check: string) => report.items.filter((i) => i.check === check);
    expect(items("stale").map((i) => [i.instrument, i.dates])).toEqual([[PLANTED.stale.instrument, [PLANTED.stale.from, PLANTED.stale.to]]]);
    expect(items("gap").map((i) => i.instrument)).toEqual([PLANTED.gap.instrument]);
    expect(items("no-history").map((i) => i.instrument)).toEqual([PLANTED.noHistory.instrument]);
    expect(items("missing-fx").map((i) => i.instrument)).toEqual([PLANTED.missingFx.instrument]);
    expect(items("extreme-return").find((i) => i.instrument === PLANTED.jump.instrument)?.dates).toContain(PLANTED.jump.date);
    expect(items("market-value-mismatch")).toEqual([]);
    expect(items("history-ends-early")).toEqual([]);

    const pellam = loadSeries("pellam-prices.csv");
    for (const [id, s] of pellam) {
      const found = checkSeries(id, s.dates, s.closes, { reportingCurrency: "GBP", periodEnd: NOVEMBER_AS_OF }).map((i) => i.check);
      expect(found.filter((c) => c !== "extreme-return"), id).toEqual([]);
    }
  });

  it("each file stays under 2.5 MB", () => {
    for (const file of readdirSync(DEMO)) expect(Buffer.byteLength(text(file)), file).toBeLessThan(2.5 * 1024 * 1024);
  });
});

describe("the generator", () => {
  const out = mkdtempSync(path.join(os.tmpdir(), "ballast-demo-"));
  afterAll(() => rmSync(out, { recursive: true, force: true }));

  it("reproduces the committed files byte for byte", () => {
    const written = generateDemoData(out);
    expect(written.sort()).toEqual(readdirSync(DEMO).sort());
    for (const file of written) expect(readFileSync(path.join(out, file)).equals(readFileSync(path.join(DEMO, file))), file).toBe(true);
  });
});

describe("statistical shape", () => {
  const inStress = (d: string) => d >= STRESS.from && d <= STRESS.to;
  const sd = (x: number[]) => {
    const m = x.reduce((a, b) => a + b, 0) / x.length;
    return Math.sqrt(x.reduce((a, b) => a + (b - m) ** 2, 0) / (x.length - 1));
  };
  const plantedIds = new Set<string>([PLANTED.stale.instrument, PLANTED.gap.instrument, PLANTED.jump.instrument, PLANTED.correction.instrument]);
  const equities = [...main.entries()].filter(([id]) => id.startsWith("NMB-EQ-") && !plantedIds.has(id));

  it("equities' realised volatility in the stress window is well above the rest of the history", () => {
    // The comparison: for each equity without a planted problem, the standard deviation of daily log returns inside
    // the stress window exceeds that outside it, and the median ratio across equities is at least 2 (the model's 3).
    const ratios = equities.map(([, s]) => {
      const stress: number[] = [], calm: number[] = [];
      for (let i = 1; i < s.dates.length; i++) (inStress(s.dates[i]) ? stress : calm).push(Math.log(s.closes[i] / s.closes[i - 1]));
      return sd(stress) / sd(calm);
    });
    expect(equities.length).toBeGreaterThanOrEqual(15);
    for (const r of ratios) expect(r).toBeGreaterThan(1);
    const sorted = [...ratios].sort((a, b) => a - b);
    expect(sorted[sorted.length >> 1]).toBeGreaterThanOrEqual(2);
  });

  it("a stressed-window search over an equal-weight equity book lands on the stress episode", () => {
    const dates = MAIN_DAYS.slice(1);
    const pnl = dates.map((_, k) => equities.reduce((sum, [, s]) => sum + (s.closes[k + 1] / s.closes[k] - 1), 0));
    const window = 60;
    const { best } = searchStressWindow(pnl, window, 0.99, "historical");
    const overlap = dates.slice(best.start, best.end).filter(inStress).length;
    expect(overlap).toBeGreaterThan(window / 2);
  });
});
