"use client";
/**
 * Where each filing pack stands: stored (its SHA-256, the figure the download's ETag and the audit record carry) or
 * being prepared by the worker (the render job's stage and progress). While one is being prepared the page asks the
 * server again every few seconds (router.refresh), so the state shown is the stored one and survives a reload.
 */
import { useEffect } from "react";
import { useRouter } from "next/navigation";
import type { PackState } from "@/lib/data/packs";

const LABEL = { docx: "Word pack", xlsx: "Spreadsheet pack" } as const;
const REFRESH_MS = 3000;
/** Stop asking after this many refreshes (about two minutes); a download still renders what is missing. */
const MAX_REFRESHES = 40;

function preparing(s: PackState): boolean {
  return !s.stored && !!s.job && (s.job.state === "queued" || s.job.state === "running");
}

function describe(s: PackState): string {
  if (s.stored) return `ready, ${new Intl.NumberFormat("en-GB").format(Math.round(s.sizeBytes / 1024))} KB`;
  if (s.job && preparing(s)) {
    const pct = s.job.progress === null ? null : Math.round(s.job.progress * 100);
    return s.job.state === "queued" ? "being prepared: waiting for the worker" : `being prepared: ${s.job.stage ?? "rendering"}${pct === null ? "" : ` (${pct} %)`}`;
  }
  return "not prepared yet: made when you download it";
}

export function PackStatus({ states }: { states: PackState[] }) {
  const router = useRouter();
  const active = states.some(preparing);
  useEffect(() => {
    if (!active) return;
    let count = 0;
    const timer = setInterval(() => {
      if (++count > MAX_REFRESHES) clearInterval(timer);
      else router.refresh();
    }, REFRESH_MS);
    return () => clearInterval(timer);
  }, [active, router]);
  return (
    // the live region wraps the list (a status role on the <ul> itself would take away its list semantics)
    <div role="status" aria-live="polite" data-testid="pack-status">
      <ul className="flex flex-col gap-1 text-xs text-ink-muted">
        {states.map((s) => (
          <li key={s.kind} data-testid={`pack-status-${s.kind}`} data-stored={s.stored ? "yes" : "no"}>
            <span aria-hidden="true">{s.stored ? "✓ " : preparing(s) ? "… " : "○ "}</span>
            {LABEL[s.kind]} {describe(s)}
            {s.stored ? <span className="block break-all font-mono">SHA-256 {s.sha256}</span> : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
