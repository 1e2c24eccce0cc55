/**
 * One label table per concept, shared by the screens, the packs and the engine's text: asset classes, VaR methods
 * and run stages. Pure (no framework or I/O).
 */
import type { VarMethod } from "@/lib/risk/portfolio/run-month-end";
import { RUN_STAGES, type RunStage } from "@/lib/runs/types";

/** The asset classes a position can carry (files spell them in many ways: lib/uploads/asset-classes.ts). */
export const ASSET_CLASSES = ["equity", "etf", "government_bond", "corporate_bond", "commodity_future", "fx", "other"] as const;
export type AssetClass = (typeof ASSET_CLASSES)[number];

/** An asset class in words. */
export const ASSET_CLASS_LABELS: Record<AssetClass, string> = {
  equity: "Equities",
  etf: "Exchange-traded funds",
  government_bond: "Government bonds",
  corporate_bond: "Corporate bonds",
  commodity_future: "Commodity futures",
  fx: "Foreign exchange",
  other: "Other",
};

/** A VaR method in words. */
export const VAR_METHOD_LABELS: Record<VarMethod, string> = {
  parametric: "Parametric",
  historical: "Historical simulation",
  filtered: "Filtered historical simulation",
};

/** A run's stage in words (the stages of lib/runs/types.ts, and "failed"). */
export const RUN_STAGE_LABELS = {
  ...Object.fromEntries(RUN_STAGES.map((s) => [s.key, s.label])),
  failed: "Failed",
} as Record<RunStage, string>;
