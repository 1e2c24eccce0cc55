/** The asset classes a position can carry, with the spellings accepted in files. */
export const ASSET_CLASSES = ["equity", "etf", "government_bond", "corporate_bond", "commodity_future", "fx", "other"] as const;
export type AssetClass = (typeof ASSET_CLASSES)[number];

export const ASSET_CLASS_LABELS: Record<AssetClass, string> = {
  equity: "Equities",
  etf: "Exchange-traded funds",
  government_bond: "Government bonds",
  corporate_bond: "Corporate bonds",
  commodity_future: "Commodity futures",
  fx: "Foreign exchange",
  other: "Other",
};

const SPELLINGS: Record<string, AssetClass> = {
  equity: "equity", equities: "equity", stock: "equity", stocks: "equity", share: "equity", shares: "equity",
  etf: "etf", etfs: "etf", fund: "etf", exchangetradedfund: "etf",
  governmentbond: "government_bond", governmentbonds: "government_bond", govbond: "government_bond", govt: "government_bond", sovereign: "government_bond",
  corporatebond: "corporate_bond", corporatebonds: "corporate_bond", corpbond: "corporate_bond",
  commodityfuture: "commodity_future", commodityfutures: "commodity_future", commodity: "commodity_future", future: "commodity_future", futures: "commodity_future",
  fx: "fx", currency: "fx", foreignexchange: "fx", fxforward: "fx",
  other: "other",
};

/** The asset class a file's spelling names, or null. */
export function parseAssetClass(text: string): AssetClass | null {
  return SPELLINGS[text.toLowerCase().replace(/[\s_\-./]+/g, "")] ?? null;
}
