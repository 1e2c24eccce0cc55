import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/app/_components/page-header";
import { DeadlineBadge } from "@/app/_components/deadline-badge";
import { StatusBadge } from "@/app/_components/status-badge";
import { formatDate, formatMonth } from "@/app/_components/format";
import { pageActor } from "@/lib/auth/page";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { getPeriod } from "@/lib/data/periods";
import { AppError } from "@/lib/errors";

export const metadata: Metadata = { title: "Period" };

export default async function PeriodPage({ params }: { params: Promise<{ periodId: string }> }) {
  const { periodId } = await params;
  const { actor } = await pageActor("periods.read");
  const period = await getPeriod(actor, periodId).catch((error) => {
    if (error instanceof AppError && error.kind === "not_found") notFound();
    throw error;
  });
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
            </div>
            {step.done ? (
              <StatusBadge tone="ok">Done</StatusBadge>
            ) : period.nextStep?.key === step.key ? (
              <StatusBadge tone="caution">Next</StatusBadge>
            ) : (
              <StatusBadge tone="neutral">Waiting</StatusBadge>
            )}
          </li>
        ))}
      </ol>
      <div className="mt-6 flex flex-wrap gap-4 text-sm">
        <Link href={`/periods/${period.id}/data-quality`} className="font-medium underline">
          Data-quality report
        </Link>
        <Link href="/data" className="font-medium underline">
          Positions and price history
        </Link>
      </div>
      {period.filingReference ? <p className="mt-4 text-sm">Regulator&apos;s reference: {period.filingReference}</p> : null}
    </>
  );
}
