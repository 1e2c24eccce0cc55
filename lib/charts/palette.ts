/**
 * The one colour table of Ballast's charts: the app's Recharts charts and the filing pack's drawn charts both read
 * it, so an estimator or a series has the same colour on screen and on paper. Pure data.
 */

/** Each volatility estimator's colour, by estimator kind. */
export const ESTIMATOR_COLOURS: Record<string, string> = {
  ma: "#6b7682",
  ewma: "#2f6b3f",
  arch: "#8a5a00",
  garch: "#1f4e79",
};

/** Colours of the charts' ink, grid and series. */
export const CHART_PALETTE = {
  ink: "#1c2733",
  soft: "#3d4a57",
  muted: "#6b7682",
  line: "#d8d3c7",
  grid: "#e6e1d6",
  paper: "#ffffff",
  brass: "#a8671c",
  alert: "#a2332b",
  /** daily P&L bars */
  pnl: "#9aa4ae",
  /** the VaR line (drawn as a loss) */
  varLine: "#1c2733",
  /** exceptions: losses beyond VaR */
  exception: "#a2332b",
  /** plain bars (contributions, capital) */
  bar: "#3d4a57",
  /** estimators without a colour of their own, in order */
  other: ["#6b4c8a", "#a8671c", "#2f5d8a"],
} as const;

/** The colour of an estimator kind (the i-th unknown one gets the i-th spare colour). */
export function estimatorColour(kind: string, index = 0): string {
  return ESTIMATOR_COLOURS[kind] ?? CHART_PALETTE.other[index % CHART_PALETTE.other.length];
}
