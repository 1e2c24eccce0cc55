/**
 * The caution every screen and export with a capital or risk figure carries. Its label says "Caution", not "Draft",
 * so that a signed filing is not headed "Draft" beside its "Signed" state. The text itself is lib/domain/caution.ts.
 */
import { DRAFT_CAUTION } from "@/lib/domain/caution";

export { DRAFT_CAUTION };

export function DraftCaution({ className = "" }: { className?: string }) {
  return (
    <p role="note" className={`rounded-md border border-caution/30 bg-caution-bg px-3 py-2 text-sm text-ink-soft ${className}`}>
      <span className="font-semibold text-caution">Caution · </span>
      {DRAFT_CAUTION}
    </p>
  );
}
