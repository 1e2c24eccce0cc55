/**
 * The Word pack's charts: SVG drawn here from the view model, rendered to PNG by @resvg/resvg-js (a native renderer
 * shipped inside its npm package) with the DejaVu Sans font from the dejavu-fonts-ttf package, so the picture is
 * the same on every machine whatever fonts it has. Each chart is titled with what it shows; the pack puts the
 * table with the same figures beside it.
 */
import { createRequire } from "node:module";
import path from "node:path";
import { existsSync } from "node:fs";
import type { FilingViewModel } from "./view-model";
import { formatAmount, formatConfidence, formatDate, formatNumber } from "./format";
import { countOf } from "@/lib/text/count";
import { CHART_PALETTE, estimatorColour } from "@/lib/charts/palette";

/** The app's chart colours (lib/charts/palette.ts), so the pack's charts look like the screens'. */
export const CHART_COLOURS = CHART_PALETTE;

/** The printed width of a chart in the Word pack: the A4 body, 17 cm, in points (1 cm = 72 / 2.54 pt). */
export const PRINTED_WIDTH_PT = (17 / 2.54) * 72;
/** The smallest text the charts print: 6 pt (common practice for figure labels, no source). */
export const MIN_PRINTED_PT = 6;

/**
 * A conservative width of a line of DejaVu Sans text: 0.72 em a character (its capitals and digits advance 0.61 to
 * 0.77 em, lower case less; from the font's advance widths, from memory).
 */
export function textWidth(text: string, fontPx: number): number {
  return text.length * 0.72 * fontPx;
}

/** An axis label's box in chart pixels, as drawn (after any rotation). */
export interface LabelBox {
  text: string;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
  fontPx: number;
}

const FONT = "DejaVu Sans";

function esc(text: string): string {
  return text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

/** About five round tick values from at or below lo to at or above hi. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  const first = Math.floor(lo / step + 1e-9) * step;
  // from the last round value at or below lo to the first at or above hi
  for (let k = 0; first + (k - 1) * step < hi - step * 1e-9; k++) {
    const v = first + k * step;
    out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  }
  return out;
}

export interface Chart {
  title: string;
  /** SVG text */
  svg: string;
  width: number;
  height: number;
  /** alternative text for the image */
  description: string;
  /** the category axis labels as laid out (for the legibility check) */
  axisLabels?: LabelBox[];
}

/** Grouped bars: each factor's one-day volatility under each estimator, the chosen estimator outlined. */
export function volatilityChart(vm: FilingViewModel): Chart | null {
  const factors = vm.figures.riskFactors.filter((f) => f.estimates.some((e) => e.volatility !== null));
  if (!factors.length) return null;
  const estimators: { id: string; label: string }[] = [];
  for (const f of factors) for (const e of f.estimates) if (!estimators.some((x) => x.id === e.estimator)) estimators.push({ id: e.estimator, label: e.label });
  const W = 1600;
  const m = { left: 120, right: 40, top: 110 };
  const plotW = W - m.left - m.right;
  const plotH = 420;
  // Labels: 24 px (7.2 pt printed at 17 cm); horizontal when each fits its group, else turned to read upwards; a
  // book with more factors than fit side by side at that size is drawn in several panels, one under the other.
  const LABEL_PX = 24;
  const minGroup = LABEL_PX * 1.25;
  const perPanel = Math.max(1, Math.floor(plotW / minGroup));
  const panels: (typeof factors)[] = [];
  for (let i = 0; i < factors.length; i += perPanel) panels.push(factors.slice(i, i + perPanel));
  const slots = Math.min(factors.length, perPanel);
  const groupW = plotW / slots;
  const longest = Math.max(...factors.map((f) => textWidth(f.factor, LABEL_PX)));
  const turned = longest > groupW - 8;
  const labelSpace = (turned ? longest : LABEL_PX) + 30;
  const panelH = plotH + labelSpace + 30;
  const legendH = 80;
  const H = m.top + panels.length * panelH + legendH;
  let max = 0;
  for (const f of factors) for (const e of f.estimates) if (e.volatility !== null) max = Math.max(max, e.volatility * 100);
  const ticks = niceTicks(0, max * 1.08);
  const top = ticks[ticks.length - 1] || 1;
  const barW = Math.min(44, (groupW * 0.8) / estimators.length);
  const colour = (id: string) => estimatorColour(id, estimators.findIndex((e) => e.id === id));
  // the chosen estimator's outline, thin enough on narrow bars to leave their colour visible
  const outline = Math.max(1.5, Math.min(4, (barW - 4) / 4)).toFixed(1);
  const title = "One-day volatility of each risk factor by estimator (%)";
  const parts: string[] = [
    `<rect width="${W}" height="${H}" fill="${CHART_COLOURS.paper}"/>`,
    `<text x="${m.left}" y="48" font-size="34" font-weight="bold" fill="${CHART_COLOURS.ink}">${esc(title)}</text>`,
  ];
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : 1;
  const decimals = Math.max(0, Math.min(3, -Math.floor(Math.log10(step) + 1e-9) + (step / 10 ** Math.floor(Math.log10(step) + 1e-9) === 2.5 ? 1 : 0)));
  const axisLabels: LabelBox[] = [];
  panels.forEach((panel, p) => {
    const top0 = m.top + p * panelH;
    const y = (v: number) => top0 + plotH - (v / top) * plotH;
    for (const t of ticks) {
      parts.push(`<line x1="${m.left}" x2="${W - m.right}" y1="${y(t)}" y2="${y(t)}" stroke="${CHART_COLOURS.line}" stroke-width="2"/>`);
      parts.push(`<text x="${m.left - 14}" y="${y(t) + 9}" font-size="24" text-anchor="end" fill="${CHART_COLOURS.muted}">${formatNumber(t, decimals)}</text>`);
    }
    panel.forEach((f, i) => {
      const x0 = m.left + i * groupW + (groupW - barW * estimators.length) / 2;
      estimators.forEach((est, k) => {
        const e = f.estimates.find((x) => x.estimator === est.id);
        if (!e || e.volatility === null) return;
        const v = e.volatility * 100;
        const chosen = f.chosen === est.id;
        parts.push(`<rect x="${x0 + k * barW + 2}" y="${y(v)}" width="${barW - 4}" height="${y(0) - y(v)}" fill="${colour(est.id)}"${chosen ? ` stroke="${CHART_COLOURS.ink}" stroke-width="${outline}"` : ""}/>`);
      });
      const cx = m.left + i * groupW + groupW / 2;
      const baseline = top0 + plotH + 14;
      const w = textWidth(f.factor, LABEL_PX);
      if (turned) {
        // turned a quarter to the left about its end, which sits under the group's centre
        parts.push(`<text x="${cx}" y="${baseline}" font-size="${LABEL_PX}" text-anchor="end" dominant-baseline="central" transform="rotate(-90 ${cx} ${baseline})" fill="${CHART_COLOURS.soft}">${esc(f.factor)}</text>`);
        axisLabels.push({ text: f.factor, x0: cx - LABEL_PX / 2, x1: cx + LABEL_PX / 2, y0: baseline, y1: baseline + w, fontPx: LABEL_PX });
      } else {
        parts.push(`<text x="${cx}" y="${baseline + LABEL_PX}" font-size="${LABEL_PX}" text-anchor="middle" fill="${CHART_COLOURS.soft}">${esc(f.factor)}</text>`);
        axisLabels.push({ text: f.factor, x0: cx - w / 2, x1: cx + w / 2, y0: baseline, y1: baseline + LABEL_PX, fontPx: LABEL_PX });
      }
    });
    parts.push(`<line x1="${m.left}" x2="${W - m.right}" y1="${y(0)}" y2="${y(0)}" stroke="${CHART_COLOURS.soft}" stroke-width="2"/>`);
  });
  // legend
  let lx = m.left;
  const ly = H - 36;
  estimators.forEach((est) => {
    parts.push(`<rect x="${lx}" y="${ly - 20}" width="26" height="26" fill="${colour(est.id)}"/>`);
    parts.push(`<text x="${lx + 36}" y="${ly}" font-size="24" fill="${CHART_COLOURS.soft}">${esc(est.label)}</text>`);
    lx += 60 + textWidth(est.label, 24) * 0.8;
  });
  parts.push(`<rect x="${lx}" y="${ly - 20}" width="26" height="26" fill="none" stroke="${CHART_COLOURS.ink}" stroke-width="4"/>`);
  parts.push(`<text x="${lx + 36}" y="${ly}" font-size="24" fill="${CHART_COLOURS.soft}">outlined: the chosen estimator</text>`);
  return {
    title,
    width: W,
    height: H,
    description: `${title}. ${factors.length} factors${panels.length > 1 ? ` in ${panels.length} panels` : ""}; the risk factors table gives every value.`,
    svg: `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="${FONT}">${parts.join("")}</svg>`,
    axisLabels,
  };
}

/** Daily P&L as bars against the one-day VaR as a loss line, exceptions in red. */
export function varPnlChart(vm: FilingViewModel): Chart | null {
  const s = vm.figures.backtest.pnlVsVar;
  if (s.length < 2) return null;
  const ccy = vm.figures.currency;
  const W = 1600;
  const H = 760;
  const m = { left: 190, right: 40, top: 110, bottom: 130 };
  const plotW = W - m.left - m.right;
  const plotH = H - m.top - m.bottom;
  let lo = 0;
  let hi = 0;
  for (const p of s) {
    lo = Math.min(lo, p.pnl, -p.var);
    hi = Math.max(hi, p.pnl);
  }
  const pad = (hi - lo) * 0.06;
  const ticks = niceTicks(lo - pad, hi + pad);
  const bottom = Math.min(ticks[0], lo);
  const top = Math.max(ticks[ticks.length - 1], hi);
  const y = (v: number) => m.top + plotH - ((v - bottom) / (top - bottom)) * plotH;
  const step = plotW / s.length;
  const title = `Daily P&L against the one-day VaR at ${formatConfidence(vm.figures.backtest.confidence)} (${ccy})`;
  const parts: string[] = [
    `<rect width="${W}" height="${H}" fill="${CHART_COLOURS.paper}"/>`,
    `<text x="${m.left}" y="48" font-size="34" font-weight="bold" fill="${CHART_COLOURS.ink}">${esc(title)}</text>`,
  ];
  for (const t of ticks) {
    if (t < bottom || t > top) continue;
    parts.push(`<line x1="${m.left}" x2="${W - m.right}" y1="${y(t)}" y2="${y(t)}" stroke="${CHART_COLOURS.line}" stroke-width="2"/>`);
    parts.push(`<text x="${m.left - 14}" y="${y(t) + 9}" font-size="24" text-anchor="end" fill="${CHART_COLOURS.muted}">${formatAmount(t)}</text>`);
  }
  s.forEach((p, i) => {
    const x = m.left + i * step + step * 0.15;
    const y0 = y(0);
    const y1 = y(p.pnl);
    parts.push(`<rect x="${x}" y="${Math.min(y0, y1)}" width="${step * 0.7}" height="${Math.max(1, Math.abs(y1 - y0))}" fill="${p.exception ? CHART_COLOURS.exception : CHART_COLOURS.pnl}"/>`);
  });
  const line = s.map((p, i) => `${i === 0 ? "M" : "L"}${(m.left + i * step + step / 2).toFixed(1)},${y(-p.var).toFixed(1)}`).join(" ");
  parts.push(`<path d="${line}" fill="none" stroke="${CHART_COLOURS.varLine}" stroke-width="4"/>`);
  parts.push(`<line x1="${m.left}" x2="${W - m.right}" y1="${y(0)}" y2="${y(0)}" stroke="${CHART_COLOURS.soft}" stroke-width="2"/>`);
  const every = Math.max(1, Math.ceil(s.length / 6));
  const axisLabels: LabelBox[] = [];
  for (let i = 0; i < s.length; i += every) {
    const cx = m.left + i * step + step / 2;
    const text = formatDate(s[i].date);
    parts.push(`<text x="${cx}" y="${m.top + plotH + 36}" font-size="24" text-anchor="middle" fill="${CHART_COLOURS.soft}">${esc(text)}</text>`);
    axisLabels.push({ text, x0: cx - textWidth(text, 24) / 2, x1: cx + textWidth(text, 24) / 2, y0: m.top + plotH + 12, y1: m.top + plotH + 36, fontPx: 24 });
  }
  const ly = H - 40;
  parts.push(`<rect x="${m.left}" y="${ly - 20}" width="26" height="26" fill="${CHART_COLOURS.pnl}"/>`);
  parts.push(`<text x="${m.left + 36}" y="${ly}" font-size="24" fill="${CHART_COLOURS.soft}">P&amp;L of the day</text>`);
  parts.push(`<rect x="${m.left + 290}" y="${ly - 20}" width="26" height="26" fill="${CHART_COLOURS.exception}"/>`);
  parts.push(`<text x="${m.left + 326}" y="${ly}" font-size="24" fill="${CHART_COLOURS.soft}">exception (loss beyond VaR)</text>`);
  parts.push(`<line x1="${m.left + 700}" x2="${m.left + 750}" y1="${ly - 8}" y2="${ly - 8}" stroke="${CHART_COLOURS.varLine}" stroke-width="4"/>`);
  parts.push(`<text x="${m.left + 762}" y="${ly}" font-size="24" fill="${CHART_COLOURS.soft}">VaR forecast for the day, as a loss</text>`);
  const exceptions = s.filter((p) => p.exception).length;
  return {
    title,
    width: W,
    height: H,
    axisLabels,
    description: `${title}, ${s.length} days from ${formatDate(s[0].date)} to ${formatDate(s[s.length - 1].date)}, ${countOf(exceptions, "exception")} in this span; the VaR history table gives every value.`,
    svg: `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="${FONT}">${parts.join("")}</svg>`,
  };
}

// The font is looked up at run time in the installed package; the turbopackIgnore comments keep the build from tracing
// (and so bundling) the whole project for these paths.
function fontFiles(): string[] {
  const names = ["DejaVuSans.ttf", "DejaVuSans-Bold.ttf"];
  const candidates: string[] = [];
  try {
    const req = createRequire(path.join(/*turbopackIgnore: true*/ process.cwd(), "package.json"));
    candidates.push(path.join(/*turbopackIgnore: true*/ path.dirname(req.resolve("dejavu-fonts-ttf/package.json")), "ttf"));
  } catch {
    // resolved below from the working directory
  }
  candidates.push(path.join(/*turbopackIgnore: true*/ process.cwd(), "node_modules", "dejavu-fonts-ttf", "ttf"));
  for (const dir of candidates) {
    const files = names.map((n) => path.join(/*turbopackIgnore: true*/ dir, n));
    if (files.every((f) => existsSync(f))) return files;
  }
  throw new Error("The chart font (dejavu-fonts-ttf) is not installed; run npm install.");
}

/**
 * Render a chart's SVG to PNG at its own pixel size.
 * @throws when the renderer or the font package is missing (the Word pack then leaves the chart out and says so)
 */
export async function renderPng(chart: Chart): Promise<Buffer> {
  const { Resvg } = await import("@resvg/resvg-js");
  const resvg = new Resvg(chart.svg, {
    fitTo: { mode: "width", value: chart.width },
    font: { loadSystemFonts: false, fontFiles: fontFiles(), defaultFontFamily: FONT },
    background: "#ffffff",
  });
  return Buffer.from(resvg.render().asPng());
}
