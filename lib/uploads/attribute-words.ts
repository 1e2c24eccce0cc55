/** A position's standardised attributes in words, for the upload preview. Pure and light (no file readers), so screens can use it. */
import type { PositionAttributes } from "./position-attributes";

/** A row's attributes in a few words for the upload preview, e.g. "bond · government · matures 2031-06-15 · coupon 2.25 %". */
export function describeAttributes(a: PositionAttributes | undefined): string {
  if (!a) return "—";
  const parts: string[] = [];
  if (a.instrumentType) parts.push(a.instrumentType);
  if (a.issuerCategory) parts.push(a.issuerCategory);
  if (a.maturityDate) parts.push(`matures ${a.maturityDate}`);
  if (a.residualMaturityYears !== undefined) parts.push(`${a.residualMaturityYears} y to maturity`);
  if (a.coupon !== undefined) parts.push(`coupon ${a.coupon} %`);
  if (a.nextResetDate) parts.push(`resets ${a.nextResetDate}`);
  if (a.nextResetYears !== undefined) parts.push(`${a.nextResetYears} y to reset`);
  if (a.modifiedDuration !== undefined) parts.push(`duration ${a.modifiedDuration}`);
  if (a.nationalMarket) parts.push(`market ${a.nationalMarket}`);
  if (a.commodity) parts.push(a.commodity);
  if (a.notional !== undefined) parts.push(`notional ${a.notional.toLocaleString("en", { maximumFractionDigits: 2 })}`);
  if (a.underlyingMaturityYears !== undefined) parts.push(`deliverable ${a.underlyingMaturityYears} y`);
  if (a.underlying) parts.push(`on ${a.underlying}`);
  if (a.optionKind) parts.push(a.optionKind);
  if (a.strike !== undefined) parts.push(`strike ${a.strike}`);
  if (a.underlyingPrice !== undefined) parts.push(`underlying at ${a.underlyingPrice}`);
  return parts.length ? parts.join(" · ") : "—";
}
