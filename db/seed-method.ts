/**
 * The demo firms' first method statement, written and approved the way the risk analyst would: a draft from the
 * defaults, the firm's choices and rationale saved, the estimator evidence computed from the seeded price history,
 * then approved — each step through lib/data/method with its audit record. Runs need an approved version.
 */
import type { Database } from "./client";
import { approveMethod, attachEvidence, createMethodDraft, updateMethodDraft } from "../lib/data/method";
import { actorForEmail } from "./actor-for";
import { setStampClock } from "../lib/clock";
import { DEFAULT_METHOD_CONTENT, type MethodDraft } from "../lib/validation/method";

const actorFor = actorForEmail;

/** Northmoor: EWMA 0.94 by default, GARCH(1,1) Student-t with an EWMA fallback for its equities. */
export const NORTHMOOR_METHOD: MethodDraft = {
  content: {
    ...DEFAULT_METHOD_CONTENT,
    defaultEstimator: { kind: "ewma", lambdaMode: "fixed", lambda: 0.94 },
    byAssetClass: { equity: { kind: "garch", distribution: "t", mean: "zero", targeting: false, fallback: "ewma" } },
    // version 1 keeps one EWMA covariance for every factor (the equity choice drives the factor volatility report only);
    // the runs and packs say so
    portfolioVolatility: "covariance",
    covariance: "ewma",
    covarianceLambda: 0.94,
    varMethod: "parametric",
    distribution: "normal",
    confidences: [0.99, 0.975],
    horizonDays: 10,
    scaling: "sqrt",
    stressWindow: { mode: "search" },
  },
  rationale:
    "Northmoor's book is mostly listed European equities with a smaller sleeve of government bonds, ETFs and commodity futures. " +
    "For most factors an EWMA with λ = 0.94 reacts quickly to a change in market conditions and needs no fitting, which keeps the monthly draft stable and easy to explain. " +
    "Single equities show clustered volatility and fat tails in our own history, so they use GARCH(1,1) with Student-t errors; where the fit fails or is near-integrated, the EWMA figure is used instead and the run says so. " +
    "On the equal-weight equity series the candidates score within a few hundredths of each other by QLIKE, so the evidence does not contradict this choice, and we review it each month against the attached comparison. " +
    "VaR is parametric at 99 % and 97.5 %, scaled to ten days by the square root of time; the stressed window is searched over the stored history rather than fixed by hand.",
  analystLimitations: [
    "Square-root-of-time scaling ignores volatility mean reversion and autocorrelation over the ten days.",
    "Futures are treated through their delta; roll effects between contracts are not modelled.",
  ],
  reason: "",
};

/** Pellam: the same defaults everywhere; a smaller book with a shorter record of its own. */
export const PELLAM_METHOD: MethodDraft = {
  content: { ...NORTHMOOR_METHOD.content },
  rationale:
    "Pellam holds a small book of UK and US equities, two ETFs and two gilts. " +
    "EWMA with λ = 0.94 is the firm-wide choice because it needs no fitting and behaves predictably on a short list of instruments; equities use GARCH(1,1) with Student-t errors, falling back to EWMA when the fit is unreliable. " +
    "Parametric VaR at 99 % and 97.5 % over ten days by square-root scaling keeps the draft comparable month to month; the stressed window is searched over the stored history.",
  analystLimitations: ["Exchange-rate risk on US holdings is taken from one USD/GBP series; cross-rates are not modelled."],
  reason: "",
};

/**
 * Write, evidence and approve version 1 for both demo firms (their price history must already be loaded): the
 * risk analyst drafts and approves on 15 September, a compliance head co-approves that afternoon (the demo firms
 * keep the default: method approval needs a second person).
 */
export async function seedDemoMethod(db: Database): Promise<void> {
  const firms = [
    ["priya.castell@northmoor.example", "helen.marsh@northmoor.example", NORTHMOOR_METHOD, 0],
    ["june.okafor@pellam.example", "rafe.pellam@pellam.example", PELLAM_METHOD, 30],
  ] as const;
  try {
    for (const [email, coEmail, draft, minutes] of firms) {
      const at = (hh: number, mm: number) => setStampClock(`2026-09-15T${String(hh).padStart(2, "0")}:${String(mm + minutes).padStart(2, "0")}:00.000Z`);
      const analyst = await actorFor(db, email);
      const head = await actorFor(db, coEmail);
      at(9, 0);
      const created = await createMethodDraft(analyst, { reason: "" });
      at(9, 10);
      await updateMethodDraft(analyst, created.id, draft);
      at(9, 20);
      await attachEvidence(analyst, created.id);
      at(10, 0);
      await approveMethod(analyst, created.id, { note: "First version for the demo." });
      at(14, 0);
      await approveMethod(head, created.id, { note: "Read the rationale and the evidence; agreed." });
    }
  } finally {
    setStampClock(null);
  }
}
