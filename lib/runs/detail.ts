/**
 * A run's per-position detail, stored apart from its figures. Each method's contributions by position grow with the
 * book (on 200,000 positions they were most of a 260 MB results JSON), while the run's page, lists, freshness and
 * filing checks need only the figures. The worker stores the figures in `runs.results` (contributions left empty,
 * `detailApart` set) and the detail in `run_details`; the contributions page, the filing packs and a reproduction
 * read both and join them. Pure.
 */
import type { PositionContribution } from "@/lib/risk";
import type { RunResults } from "./types";

/** The contributions by position of each method (in `monthEnd.methods` order), by confidence (in each method's order). */
export interface RunDetail {
  contributions: PositionContribution[][][];
}

/** The run's figures without the per-position detail (marked `detailApart`), and that detail. */
export function splitDetail(results: RunResults): { figures: RunResults; detail: RunDetail } {
  const detail: RunDetail = { contributions: results.monthEnd.methods.map((m) => m.byConfidence.map((c) => c.contributions)) };
  const methods = results.monthEnd.methods.map((m) => ({ ...m, byConfidence: m.byConfidence.map((c) => ({ ...c, contributions: [] })) }));
  return { figures: { ...results, monthEnd: { ...results.monthEnd, methods }, detailApart: true }, detail };
}

/** The whole results again: the figures with their stored detail put back (`detailApart` cleared). */
export function joinDetail(figures: RunResults, detail: RunDetail): RunResults {
  const methods = figures.monthEnd.methods.map((m, i) => {
    if (detail.contributions[i]?.length !== m.byConfidence.length) throw new Error(`The run's stored detail does not match its figures (method ${m.method}).`);
    return { ...m, byConfidence: m.byConfidence.map((c, j) => ({ ...c, contributions: detail.contributions[i][j] })) };
  });
  if (detail.contributions.length !== methods.length) throw new Error("The run's stored detail does not match its figures (methods).");
  const joined: RunResults = { ...figures, monthEnd: { ...figures.monthEnd, methods } };
  delete joined.detailApart;
  return joined;
}
