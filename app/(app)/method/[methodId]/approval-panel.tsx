"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch } from "@/app/_components/api";
import { inputClass, primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import type { MethodVersion } from "@/lib/data/method";
import { Panel } from "@/app/_components/panel";

/**
 * Approve, co-approve or discard a draft. What shows depends on the person: the risk analyst approves (and may
 * discard); where the firm requires it, a compliance head — a different person — co-approves.
 */
export function ApprovalPanel({
  version,
  coApprovalRequired,
  canApprove,
  canDiscard = false,
  canCoApprove = false,
  unsaved = false,
}: {
  version: MethodVersion;
  coApprovalRequired: boolean;
  canApprove: boolean;
  canDiscard?: boolean;
  canCoApprove?: boolean;
  unsaved?: boolean;
}) {
  const router = useRouter();
  const [pending, setPending] = useState<null | "approve" | "discard">(null);
  const [confirmDiscard, setConfirmDiscard] = useState(false);
  const [confirmApprove, setConfirmApprove] = useState(false);
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | null>(null);

  async function call(kind: "approve" | "discard") {
    setPending(kind);
    setError(null);
    try {
      await apiFetch(`/api/method/${version.id}/${kind}`, { method: "POST", body: kind === "approve" ? { note } : {} });
      setConfirmApprove(false);
      if (kind === "discard") router.push("/method");
      router.refresh();
    } catch (e) {
      setError(e instanceof Error ? e.message : "Could not complete.");
    } finally {
      setPending(null);
    }
  }

  const analystStep = canApprove && !version.awaitingCoApproval;
  const coStep = canCoApprove && version.awaitingCoApproval;
  const blockers = [!version.evidence ? "attach the evidence" : null, unsaved ? "save your changes" : null].filter(Boolean);

  return (
    <Panel id="approval" title="Approval" padding="p-5" headingClassName="mb-2 text-lg font-semibold">
      <p className="mb-3 text-sm text-ink-soft">
        {version.awaitingCoApproval
          ? `Approved by ${version.approvedBy?.name}; waiting for a compliance head to co-approve. Once approved, this version cannot change and replaces the current one for new runs.`
          : coApprovalRequired
            ? "The risk analyst approves; then a compliance head, a different person, co-approves. Once approved, this version cannot change and replaces the current one for new runs."
            : "Once approved, this version cannot change and replaces the current one for new runs."}
      </p>
      <div className="flex flex-wrap items-center gap-3">
        {(analystStep || coStep) && !confirmApprove ? (
          <button type="button" className={primaryButtonClass} disabled={pending !== null || (analystStep && blockers.length > 0)} onClick={() => setConfirmApprove(true)}>
            {coStep ? `Co-approve version ${version.version}…` : `Approve version ${version.version}…`}
          </button>
        ) : null}
        {canDiscard ? (
          confirmDiscard ? (
            <span className="flex items-center gap-2 text-sm">
              Discard draft version {version.version}?
              <button type="button" className={secondaryButtonClass} onClick={() => call("discard")} disabled={pending !== null}>
                {pending === "discard" ? "Discarding…" : "Yes, discard"}
              </button>
              <button type="button" className="underline" onClick={() => setConfirmDiscard(false)}>
                Keep it
              </button>
            </span>
          ) : (
            <button type="button" className={secondaryButtonClass} onClick={() => setConfirmDiscard(true)} disabled={pending !== null}>
              Discard draft
            </button>
          )
        ) : null}
        {analystStep && blockers.length ? <p className="text-sm text-ink-muted">Before approving, {blockers.join(" and ")}.</p> : null}
        {!analystStep && !coStep && !canDiscard ? (
          <p className="text-sm text-ink-muted">
            {version.awaitingCoApproval ? "A compliance head other than the analyst co-approves." : "The risk analyst approves this draft."} Your role reads it only.
          </p>
        ) : null}
      </div>
      {confirmApprove && (analystStep || coStep) ? (
        <div role="group" aria-labelledby="confirm-approval" className="mt-4 rounded-md border border-brass/40 bg-paper p-4">
          <p id="confirm-approval" className="font-medium">
            {coStep
              ? `Co-approve version ${version.version}, approved by ${version.approvedBy?.name}?`
              : coApprovalRequired
                ? `Approve version ${version.version}? A compliance head then co-approves before it takes effect.`
                : `Approve version ${version.version}? It takes effect at once: the firm allows one-person approval.`}
          </p>
          <p className="mt-1 text-sm text-ink-soft">
            {coStep || !coApprovalRequired
              ? "From then on it cannot change; new runs use it and the version it replaces is kept as superseded."
              : "Until then it stays a draft; saving a change withdraws your approval."}
          </p>
          <label htmlFor="approval-note" className="mt-3 block text-sm font-medium">
            Note for the audit trail (optional)
          </label>
          <textarea id="approval-note" rows={2} maxLength={1000} className={`${inputClass} mt-1 w-full`} value={note} onChange={(e) => setNote(e.target.value)} autoFocus />
          <div className="mt-3 flex flex-wrap gap-3">
            <button type="button" className={primaryButtonClass} disabled={pending !== null} onClick={() => call("approve")}>
              {pending === "approve" ? (coStep ? "Co-approving…" : "Approving…") : coStep ? "Yes, co-approve" : "Yes, approve"}
            </button>
            <button type="button" className={secondaryButtonClass} disabled={pending !== null} onClick={() => setConfirmApprove(false)}>
              Cancel
            </button>
          </div>
        </div>
      ) : null}
      {error ? (
        <p role="alert" className="mt-2 text-sm text-alert">
          {error}
        </p>
      ) : null}
    </Panel>
  );
}
