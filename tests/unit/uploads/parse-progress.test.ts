import { describe, expect, it } from "vitest";
import { parsePositions } from "@/lib/uploads/parse-positions";
import { parsePrices } from "@/lib/uploads/parse-prices";
import { PROGRESS_EVERY, type RawTable, type ReadOptions } from "@/lib/uploads/types";

const plain: ReadOptions = { numberFormat: "plain" };

/** The date i days after 2020-01-01 (before the test's today for i < 2000; distinct per instrument). */
function dateOf(i: number): string {
  const d = new Date(Date.UTC(2020, 0, 1) + i * 86_400_000);
  return d.toISOString().slice(0, 10);
}

function recorder() {
  const calls: [number, number][] = [];
  return { calls, onProgress: (done: number, total: number) => void calls.push([done, total]) };
}

describe("parsers report how many rows they have checked", () => {
  it("a long price file: every PROGRESS_EVERY rows, then once at the end with the total", () => {
    const n = PROGRESS_EVERY * 2 + 7;
    const table: RawTable = { source: "csv", header: ["date", "instrument", "close"], rows: Array.from({ length: n }, (_, i) => [dateOf(i % 2000), `I${Math.floor(i / 2000)}`, 10 + (i % 5)]) };
    const { calls, onProgress } = recorder();
    const parsed = parsePrices(table, plain, { today: "2026-12-01", onProgress });
    expect(parsed.problems).toEqual([]);
    expect(parsed.points).toHaveLength(n);
    expect(calls).toEqual([
      [PROGRESS_EVERY, n],
      [PROGRESS_EVERY * 2, n],
      [n, n],
    ]);
  });

  it("a wide price file counts prices (rows × instrument columns), never past the total", () => {
    const columns = 3;
    const rows = Math.ceil(PROGRESS_EVERY / columns) * 2 + 1;
    const table: RawTable = { source: "csv", header: ["date", "A", "B", "C"], rows: Array.from({ length: rows }, (_, i) => [dateOf(i), 1, 2, 3]) };
    const { calls, onProgress } = recorder();
    parsePrices(table, plain, { today: "2026-12-01", onProgress });
    const total = rows * columns;
    expect(calls.length).toBe(3);
    expect(calls.every(([done, t]) => t === total && done <= total)).toBe(true);
    expect(calls.map(([done]) => done)).toEqual([...calls.map(([done]) => done)].sort((a, b) => a - b));
    expect(calls.at(-1)).toEqual([total, total]);
  });

  it("a positions file reports rows with or without problems, then the total", () => {
    const n = PROGRESS_EVERY + 3;
    const header = ["as_of", "book", "instrument_id", "instrument_name", "asset_class", "currency", "quantity", "price", "market_value", "delta_exposure"];
    // every other row has an unknown asset class: refused rows are checked rows too
    const table: RawTable = { source: "csv", header, rows: Array.from({ length: n }, (_, i) => ["2026-11-30", "TRADING", `EQ-${i}`, `Instrument ${i}`, i % 2 ? "nonsense" : "equity", "EUR", 1, 2, 2, ""]) };
    const { calls, onProgress } = recorder();
    const parsed = parsePositions(table, plain, { today: "2026-12-01", reportingCurrency: "EUR", periodEnd: "2026-11-30", onProgress });
    expect(parsed.rows.length).toBe(Math.ceil(n / 2));
    expect(calls).toEqual([
      [PROGRESS_EVERY, n],
      [n, n],
    ]);
  });

  it("a file refused before its rows (missing columns) is not reported", () => {
    const { calls, onProgress } = recorder();
    parsePrices({ source: "csv", header: ["when"], rows: [["2026-11-02"]] }, plain, { today: "2026-12-01", onProgress });
    parsePositions({ source: "csv", header: ["book"], rows: [["X"]] }, plain, { today: "2026-12-01", reportingCurrency: "EUR", onProgress });
    expect(calls).toEqual([]);
  });
});
