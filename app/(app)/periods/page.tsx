import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { DeadlineBadge } from "@/app/_components/deadline-badge";
import { formatDate, formatMonth } from "@/app/_components/format";
import { pageActor } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { listPeriods } from "@/lib/data/periods";
import { today } from "@/lib/clock";
import { latestMonthEnd } from "@/lib/calendar/deadline";
import { OpenPeriodForm } from "./open-period-form";
import { SimpleTable } from "@/app/_components/simple-table";

export const metadata: Metadata = { title: "Periods" };

export default async function PeriodsPage() {
  const { actor } = await pageActor("periods.read");
  const periods = await listPeriods(actor);
  return (
    <>
      <PageHeader title="Reporting periods" lead="Each month end, with its deadline under the firm's calendar and the step it waits on." />
      {can(actor, "periods.open") ? <OpenPeriodForm defaultMonth={latestMonthEnd(today()).slice(0, 7)} /> : null}
      {periods.length === 0 ? (
        <p className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6 text-ink-soft">No period has been opened yet.</p>
      ) : (
        <SimpleTable caption="Reporting periods" padding="px-4 py-2" columns={["Period", "Deadline", "Status", "Waiting on", { label: "Steps done", align: "right" }]}>
          {periods.map((p) => (
            <tr key={p.id} className="border-t border-ink-line">
              <td className="px-4 py-2">
                <Link href={`/periods/${p.id}`} className="font-medium hover:underline">
                  {formatMonth(p.periodEnd)}
                </Link>
              </td>
              <td className="figure px-4 py-2">{formatDate(p.deadline)}</td>
              <td className="px-4 py-2">
                <DeadlineBadge businessDaysLeft={p.businessDaysLeft} overdue={p.overdue} done={p.nextStep === null} />
              </td>
              <td className="px-4 py-2">{p.nextStep ? `${p.nextStep.label} (${ROLE_LABELS[p.nextStep.owner]})` : "Nothing: filed"}</td>
              <td className="figure px-4 py-2 text-right">
                {p.steps.filter((s) => s.done).length} / {p.steps.length}
              </td>
            </tr>
          ))}
        </SimpleTable>
      )}
    </>
  );
}
