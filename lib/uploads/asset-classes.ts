import { ASSET_CLASSES, ASSET_CLASS_LABELS, type AssetClass } from "@/lib/domain/labels";

/** The asset classes and their words live in lib/domain/labels.ts; re-exported for the readers of files. */
export { ASSET_CLASSES, ASSET_CLASS_LABELS, type AssetClass };

/**
 * The one table of spellings a file may use for each asset class (compared without case, spaces, underscores,
 * hyphens, dots or slashes). The Data page and the column guide show this table; the parser reads only it.
 * A bare "bond" is read as a corporate bond: without the issuer, the class with the larger specific-risk weight.
 */
export const ASSET_CLASS_ALIASES: Record<AssetClass, readonly string[]> = {
  equity: ["equity", "equities", "stock", "stocks", "share", "shares"],
  etf: ["etf", "etfs", "fund", "exchange traded fund"],
  government_bond: ["government bond", "government bonds", "gov bond", "govt", "govt bond", "sovereign", "gilt", "treasury"],
  corporate_bond: ["corporate bond", "corporate bonds", "corp bond", "bond", "bonds"],
  commodity_future: ["commodity future", "commodity futures", "commodity", "future", "futures"],
  fx: ["fx", "currency", "foreign exchange", "fx forward"],
  other: ["other"],
};

/** A spelling as the parser compares it. */
function spellingKey(text: string): string {
  return text.toLowerCase().replace(/[\s_\-./]+/g, "");
}

const SPELLINGS: Record<string, AssetClass> = Object.fromEntries(
  (Object.entries(ASSET_CLASS_ALIASES) as [AssetClass, readonly string[]][]).flatMap(([cls, names]) => [cls, ...names].map((n) => [spellingKey(n), cls])),
);

/** The asset class a file's spelling names, or null. */
export function parseAssetClass(text: string): AssetClass | null {
  return SPELLINGS[spellingKey(text)] ?? null;
}
