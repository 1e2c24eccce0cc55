/**
 * The capital table, once: its caption, columns, headings, the terms in order and how each figure is written. The
 * filing page and the Word pack both render it; the screen ignores the Word widths.
 */
import { formatAmount, formatNumber } from "./format";
import type { CapitalFigures } from "./view-model";

/** One column of the capital table: its heading, whether it holds figures, its relative width in the Word pack. */
export interface CapitalTableColumn {
  header: string;
  numeric?: boolean;
  weight: number;
}

/** The capital table's caption (the page's screen-reader caption). */
export const CAPITAL_TABLE_CAPTION = "Every term of the capital formula";

/** The capital table's columns: the term, its value, the unit. */
export const CAPITAL_TABLE_COLUMNS: readonly CapitalTableColumn[] = [
  { header: "Term", weight: 3 },
  { header: "Value", numeric: true, weight: 1.6 },
  { header: "Unit", weight: 0.6 },
];

/** The capital table's rows (term, value, unit), the stressed terms only where the profile includes them; the last row is the total. */
export function capitalTableRows(c: CapitalFigures, currency: string): { rows: string[][]; totalRows: number[] } {
  const a = formatAmount;
  const rows: string[][] = [
    ["Latest VaR, VaR(t−1)", a(c.varLast), currency],
    [`Average VaR over ${c.averagingDays} days`, a(c.varAverage), currency],
    ["Multiplier = base + plus factor", `${formatNumber(c.multiplierBase, 2)} + ${formatNumber(c.plusFactor, 2)} = ${formatNumber(c.multiplier, 2)}`, "—"],
    ["VaR term = max(VaR(t−1), multiplier × average)", a(c.varTerm), currency],
  ];
  if (c.includesStressed && c.stressedVarLast !== null && c.stressedVarAverage !== null && c.stressedMultiplier !== null) {
    rows.push(
      ["Latest stressed VaR, sVaR(t−1)", a(c.stressedVarLast), currency],
      [`Average stressed VaR over ${c.averagingDays} days`, a(c.stressedVarAverage), currency],
      ["Stressed multiplier", formatNumber(c.stressedMultiplier, 2), "—"],
      ["Stressed term = max(sVaR(t−1), multiplier × average)", a(c.stressedVarTerm), currency],
    );
  }
  rows.push(["Capital", a(c.capital), currency]);
  return { rows, totalRows: [rows.length - 1] };
}
