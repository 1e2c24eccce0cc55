/** Reading the volatility reference fixtures (one numeric column under a header). */
import { readFileSync } from "node:fs";
import path from "node:path";

/** The fixtures folder. */
export const FIXTURES = path.join(__dirname, "fixtures");

/** Read a one-column CSV fixture as numbers. */
export function readSeries(file: string): number[] {
  const lines = readFileSync(path.join(FIXTURES, file), "utf8").trim().split(/\r?\n/).slice(1);
  return lines.map(Number);
}

/** |actual − expected| ≤ rtol·|expected|. */
export function relErr(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}
