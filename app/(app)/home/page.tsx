import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { DeadlineBadge } from "@/app/_components/deadline-badge";
import { StatusBadge } from "@/app/_components/status-badge";
import { formatDate, formatMonth } from "@/app/_components/format";
import { pageActor } from "@/lib/auth/page";
import { listPeriods } from "@/lib/data/periods";
import { homeItems } from "@/lib/data/home";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "This month" };

/** "What does this month end need from me now?" */
export default async function HomePage() {
  const { actor } = await pageActor();
  const periods = await listPeriods(actor);
  const open = periods.filter((p) => p.nextStep !== null);
  const mine = open.filter((p) => p.nextStep && actor.roles.includes(p.nextStep.owner));
  const { items, newFirm } = await homeItems(actor, open);
  const actions = items.filter((i) => i.tone === "action");

  return (
    <>
      <PageHeader
        title={`Good day, ${actor.name.split(" ")[0]}`}
        lead={
          actions.length > 0
            ? `${actions.length} thing${actions.length === 1 ? "" : "s"} for you this month end.`
            : mine.length > 0
            ? `${mine.length} open period${mine.length === 1 ? " needs" : "s need"} something from you.`
            : open.length > 0
              ? "Nothing is waiting on you right now; others own the next steps below."
              : "No reporting period is open."
        }
      />
      {newFirm ? (
        <section aria-labelledby="first-steps" className="mb-6 rounded-lg border border-brass bg-paper-raised p-6">
          <h2 id="first-steps" className="text-lg font-semibold">
            Getting started
          </h2>
          <ol className="mt-3 list-decimal space-y-2 pl-5 text-ink-soft">
            <li>
              The risk analyst uploads the firm&apos;s price history (daily closes, and exchange rates named like USD{actor.reportingCurrency}) on{" "}
              <Link href="/data" className="underline">Data</Link>. Blank templates:{" "}
              <a href="/api/templates/prices-long.csv" className="underline">prices-long.csv</a>,{" "}
              <a href="/api/templates/prices-wide.csv" className="underline">prices-wide.csv</a>.
            </li>
            <li>
              The compliance officer uploads the month-end positions for the open period (template:{" "}
              <a href="/api/templates/positions.csv" className="underline">positions.csv</a>).
            </li>
            <li>The risk analyst writes and approves the method statement, then starts the month&apos;s run.</li>
            <li>The compliance officer prepares the draft filing; the compliance head reviews and signs it.</li>
          </ol>
        </section>
      ) : null}
      {items.length > 0 ? (
        <section aria-labelledby="for-you" className="mb-6">
          <h2 id="for-you" className="sr-only">
            For you now
          </h2>
          <ul className="flex flex-col gap-2" data-testid="home-items">
            {items.map((item, i) => (
              <li key={i} className={`flex items-center justify-between gap-3 rounded-lg border bg-paper-raised px-4 py-3 ${item.tone === "action" ? "border-brass" : "border-ink-line"}`}>
                <span>
                  {item.tone === "action" ? <StatusBadge tone="caution">To do</StatusBadge> : <StatusBadge tone="neutral">Note</StatusBadge>} <span className="ml-1">{item.text}</span>
                </span>
                <Link href={item.href} className="shrink-0 text-sm font-medium text-brass underline">
                  Open
                </Link>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {open.length === 0 ? (
        <div className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-8 text-center">
          <h2 className="text-lg font-semibold">No open reporting period</h2>
          <p className="mx-auto mt-2 max-w-xl text-ink-soft">
            Periods open at each month end. {can(actor, "periods.open") ? "You can also open one by hand from Periods." : "A compliance officer can also open one by hand."}
          </p>
          <Link href="/periods" className="mt-4 inline-block font-medium text-brass underline">
            Go to periods
          </Link>
        </div>
      ) : (
        <ul className="grid gap-4 lg:grid-cols-2">
          {open.map((p) => {
            const yours = p.nextStep && actor.roles.includes(p.nextStep.owner);
            return (
              <li key={p.id} className={`rounded-lg border bg-paper-raised p-5 ${yours ? "border-brass" : "border-ink-line"}`}>
                <div className="flex flex-wrap items-start justify-between gap-2">
                  <div>
                    <h2 className="text-lg font-semibold">
                      <Link href={`/periods/${p.id}`} className="hover:underline">
                        {formatMonth(p.periodEnd)}
                      </Link>
                    </h2>
                    <p className="text-sm text-ink-muted">Deadline {formatDate(p.deadline)}</p>
                  </div>
                  <DeadlineBadge businessDaysLeft={p.businessDaysLeft} overdue={p.overdue} done={false} />
                </div>
                {p.nextStep ? (
                  <div className="mt-4 rounded-md bg-paper-sunk p-3">
                    <p className="text-xs uppercase tracking-wide text-ink-muted">Next step</p>
                    <p className="mt-1 font-medium">{p.nextStep.label}</p>
                    <p className="mt-1 text-sm text-ink-soft">
                      Owner: {ROLE_LABELS[p.nextStep.owner]} {yours ? <StatusBadge tone="caution">Yours</StatusBadge> : null}
                    </p>
                  </div>
                ) : null}
                <p className="mt-3 text-sm text-ink-muted">
                  {p.steps.filter((s) => s.done).length} of {p.steps.length} steps done
                </p>
              </li>
            );
          })}
        </ul>
      )}
    </>
  );
}
