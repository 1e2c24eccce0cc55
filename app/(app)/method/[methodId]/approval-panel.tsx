"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch } from "@/app/_components/api";
import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import type { MethodVersion } from "@/lib/data/method";

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
  const [error, setError] = useState<string | null>(null);

  async function call(kind: "approve" | "discard") {
    setPending(kind);
    setError(null);
    try {
      await apiFetch(`/api/method/${version.id}/${kind}`, { method: "POST", body: {} });
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
    <section aria-labelledby="approval" className="rounded-lg border border-ink-line bg-paper-raised p-5">
      <h2 id="approval" className="mb-2 text-lg font-semibold">
        Approval
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        {version.awaitingCoApproval
          ? `Approved by ${version.approvedBy?.name}; waiting for a compliance head to co-approve. Once approved, this version cannot change and replaces the current one for new runs.`
          : coApprovalRequired
            ? "The risk analyst approves; then a compliance head, a different person, co-approves. Once approved, this version cannot change and replaces the current one for new runs."
            : "Once approved, this version cannot change and replaces the current one for new runs."}
      </p>
      <div className="flex flex-wrap items-center gap-3">
        {analystStep ? (
          <button type="button" className={primaryButtonClass} disabled={pending !== null || blockers.length > 0} onClick={() => call("approve")}>
            {pending === "approve" ? "Approving…" : `Approve version ${version.version}`}
          </button>
        ) : null}
        {coStep ? (
          <button type="button" className={primaryButtonClass} disabled={pending !== null} onClick={() => call("approve")}>
            {pending === "approve" ? "Co-approving…" : `Co-approve version ${version.version}`}
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
      {error ? (
        <p role="alert" className="mt-2 text-sm text-alert">
          {error}
        </p>
      ) : null}
    </section>
  );
}
