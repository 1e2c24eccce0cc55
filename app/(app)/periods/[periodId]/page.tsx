import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { DeadlineBadge } from "@/app/_components/deadline-badge";
import { StatusBadge } from "@/app/_components/status-badge";
import { formatDate, formatMonth, formatTimestamp } from "@/app/_components/format";
import { UploadStatus } from "@/app/_components/upload-status";
import { listUploads } from "@/lib/data/uploads";
import { orNotFound, pageActor } from "@/lib/auth/page";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { getPeriod } from "@/lib/data/periods";
import { can } from "@/lib/auth/permissions";
import { WithdrawPeriod } from "./withdraw-period";

export const metadata: Metadata = { title: "Period" };

export default async function PeriodPage({ params }: { params: Promise<{ periodId: string }> }) {
  const { periodId } = await params;
  const { actor } = await pageActor("periods.read");
  const period = await orNotFound(getPeriod(actor, periodId));
  const uploads = await listUploads(actor, { periodId: period.id, kind: "positions" });
  return (
    <>
      <PageHeader
        title={formatMonth(period.periodEnd)}
        lead={<>Period ending {formatDate(period.periodEnd)} · deadline {formatDate(period.deadline)}</>}
        actions={<DeadlineBadge businessDaysLeft={period.businessDaysLeft} overdue={period.overdue} done={period.nextStep === null} />}
      />
      <ol className="space-y-2" aria-label="Month-end steps">
        {period.steps.map((step, i) => (
          <li key={step.key} className="flex flex-wrap items-center justify-between gap-2 rounded-lg border border-ink-line bg-paper-raised px-4 py-3">
            <div>
              <p className="font-medium">
                {i + 1}. {step.label}
              </p>
              <p className="text-sm text-ink-muted">{ROLE_LABELS[step.owner]}</p>
              {step.note ? (
                <p className="mt-1 text-sm text-caution" data-testid={`step-note-${step.key}`}>
                  {step.note}
                </p>
              ) : null}
            </div>
            {step.note && step.key === "run" && !step.done ? (
              <StatusBadge tone="caution">Stale run</StatusBadge>
            ) : step.done ? (
              <StatusBadge tone="ok">Done</StatusBadge>
            ) : period.nextStep?.key === step.key ? (
              <StatusBadge tone="caution">Next</StatusBadge>
            ) : (
              <StatusBadge tone="neutral">Waiting</StatusBadge>
            )}
          </li>
        ))}
      </ol>
      <section aria-labelledby="period-uploads" className="mt-8">
        <h2 id="period-uploads" className="mb-2 text-lg font-semibold">
          Positions files of this period
        </h2>
        {uploads.length === 0 ? (
          <p className="text-sm text-ink-soft">No positions file yet.</p>
        ) : (
          <ul className="divide-y divide-ink-line rounded-lg border border-ink-line bg-paper-raised">
            {uploads.map((u) => (
              <li key={u.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-2 text-sm">
                <Link href={`/data/uploads/${u.id}`} className="font-medium hover:underline">
                  {u.fileName}
                </Link>
                <span className="flex items-center gap-3">
                  <span className="figure text-ink-muted">{u.rowCount} rows · {formatTimestamp(u.createdAt)}</span>
                  <UploadStatus status={u.status} />
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
      <div className="mt-6 flex flex-wrap gap-4 text-sm">
        <Link href={`/periods/${period.id}/runs`} className="font-medium underline">
          Runs
        </Link>
        <Link href={`/periods/${period.id}/filing`} className="font-medium underline">
          Draft filing and sign-off
        </Link>
        <Link href={`/periods/${period.id}/data-quality`} className="font-medium underline">
          Data-quality report
        </Link>
        <Link href="/data" className="font-medium underline">
          Positions and price history
        </Link>
      </div>
      {period.filingReference ? <p className="mt-4 text-sm">Regulator&apos;s reference: {period.filingReference}</p> : null}
      {can(actor, "periods.open") && period.state === "open" && uploads.length === 0 && !period.steps.some((s) => s.done && s.key !== "method") ? (
        <div className="mt-8">
          <WithdrawPeriod periodId={period.id} label={formatMonth(period.periodEnd)} />
        </div>
      ) : null}
    </>
  );
}
