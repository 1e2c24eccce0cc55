/**
 * The caution every screen and export with a capital or risk figure carries. Its label says "Caution", not "Draft",
 * so that a signed filing is not headed "Draft" beside its "Signed" state.
 */
export const DRAFT_CAUTION =
  "Draft computed under the stated method and the firm's configured rules, for review and sign-off by the firm's licensed compliance officer. Local rules and the regulator's current requirements govern.";

export function DraftCaution({ className = "" }: { className?: string }) {
  return (
    <p role="note" className={`rounded-md border border-caution/30 bg-caution-bg px-3 py-2 text-sm text-ink-soft ${className}`}>
      <span className="font-semibold text-caution">Caution · </span>
      {DRAFT_CAUTION}
    </p>
  );
}
