import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { DeadlineBadge } from "@/app/_components/deadline-badge";
import { StatusBadge } from "@/app/_components/status-badge";
import { Forbidden } from "@/app/_components/forbidden";
import { formatDate, formatMonth } from "@/app/_components/format";
import { secondaryButtonClass } from "@/app/_components/field";
import { pageActor } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { calendarView } from "@/lib/calendar/view";
import { getMyReminderPreference } from "@/lib/data/calendar-settings";
import { listReminderLog } from "@/lib/data/reminder-log";
import { mailListenerUrl } from "@/lib/mail/inbox";
import { ReminderPreference } from "./reminder-preference";
import { ReminderLog } from "./reminder-log";
import { SimpleTable } from "@/app/_components/simple-table";

export const metadata: Metadata = { title: "Calendar" };

const ruleText = (rule: Awaited<ReturnType<typeof calendarView>>["rule"]) =>
  rule.kind === "business-days-after"
    ? `${rule.days} business days after the period ends`
    : `day ${rule.day} of the following month (the next business day when that is a weekend or holiday)`;

/** Coming filing deadlines, days left, who owns the next step; reminders and the .ics download. */
export default async function CalendarPage() {
  const { actor, allowed } = await pageActor("periods.read");
  if (!allowed) return <Forbidden what="The filing calendar is for the firm's members." />;
  const view = await calendarView(actor);
  const preference = await getMyReminderPreference(actor);
  const admin = can(actor, "calendar.manage");
  const log = admin ? await listReminderLog(actor, 30) : [];
  const offsets = view.reminders.reminderOffsets;

  return (
    <>
      <PageHeader
        title="Calendar"
        lead={`Filing deadlines fall ${ruleText(view.rule)}; weekends and the firm's holidays are not business days. Today is ${formatDate(view.today)}.`}
        actions={
          <a href="/api/calendar/ics" className={secondaryButtonClass} download>
            Download deadlines (.ics)
          </a>
        }
      />

      <section aria-labelledby="open-heading" className="mb-8">
        <h2 id="open-heading" className="mb-3 text-lg font-semibold">
          Open periods
        </h2>
        {view.open.length === 0 ? (
          <p className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6 text-ink-soft">No period is open; the next one opens at month end.</p>
        ) : (
          <SimpleTable caption="Open reporting periods and their deadlines" testId="open-deadlines" padding="px-4 py-2" columns={["Period", "Deadline", { label: "Business days left", align: "right" }, "State", "Next step and owner", "Next reminder"]}>
            {view.open.map((p) => (
              <tr key={p.id} className={`border-t border-ink-line ${p.overdue ? "bg-alert-bg/40" : ""}`} data-testid="deadline-row">
                <th scope="row" className="px-4 py-2 text-left font-medium">
                  <Link href={`/periods/${p.id}`} className="hover:underline">
                    {formatMonth(p.periodEnd)}
                  </Link>
                </th>
                <td className="figure px-4 py-2">{formatDate(p.deadline)}</td>
                <td className="figure px-4 py-2 text-right">{p.overdue ? `−${Math.abs(p.businessDaysLeft)}` : p.businessDaysLeft}</td>
                <td className="px-4 py-2">
                  <DeadlineBadge businessDaysLeft={p.businessDaysLeft} overdue={p.overdue} done={false} />
                </td>
                <td className="px-4 py-2">
                  {p.nextStep ? (
                    <>
                      {p.nextStep.label}
                      <span className="block text-xs text-ink-muted">
                        {ROLE_LABELS[p.nextStep.owner]}
                        {actor.roles.includes(p.nextStep.owner) ? " · yours" : ""}
                      </span>
                    </>
                  ) : null}
                </td>
                <td className="px-4 py-2 text-ink-soft">{p.overdue ? (view.reminders.remindOverdue ? "Overdue notice" : "None") : p.nextReminder ? formatDate(p.nextReminder) : "None left"}</td>
              </tr>
            ))}
          </SimpleTable>
        )}
      </section>

      <div className="grid gap-8 lg:grid-cols-2">
        <section aria-labelledby="coming-heading">
          <h2 id="coming-heading" className="mb-3 text-lg font-semibold">
            Coming deadlines
          </h2>
          <ul className="divide-y divide-ink-line rounded-lg border border-ink-line bg-paper-raised" data-testid="coming-deadlines">
            {view.coming.map((c) => (
              <li key={c.periodEnd} className="flex items-center justify-between gap-3 px-4 py-3 text-sm">
                <span>
                  <span className="font-medium">{formatMonth(c.periodEnd)}</span>
                  <span className="block text-xs text-ink-muted">Opens {formatDate(c.periodEnd)}</span>
                </span>
                <span className="text-right">
                  <span className="figure block">{formatDate(c.deadline)}</span>
                  <span className="block text-xs text-ink-muted">{c.businessDaysLeft} business days away</span>
                </span>
              </li>
            ))}
          </ul>
          <p className="mt-2 text-xs text-ink-muted">Projected under today&apos;s rule and holiday list; a period&apos;s deadline is fixed when it opens.</p>
        </section>

        <section aria-labelledby="reminders-heading">
          <h2 id="reminders-heading" className="mb-3 text-lg font-semibold">
            Reminders
          </h2>
          <div className="rounded-lg border border-ink-line bg-paper-raised p-5 text-sm">
            <p>
              E-mails go to whoever owns the open step{" "}
              {offsets.length ? (
                <>
                  at <strong>{offsets.join(", ")}</strong> business day{offsets.length === 1 && offsets[0] === 1 ? "" : "s"} before the deadline
                </>
              ) : (
                "at no set days before the deadline"
              )}
              {view.reminders.remindOverdue ? ", and once when it is overdue." : "."}
              {admin ? (
                <>
                  {" "}
                  <Link href="/settings#calendar-heading" className="underline">
                    Change the schedule
                  </Link>
                </>
              ) : null}
            </p>
            <ReminderPreference initial={preference.remindersEnabled} />
          </div>
        </section>
      </div>

      {admin ? (
        <section aria-labelledby="delivery-heading" className="mt-8">
          <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="delivery-heading" className="text-lg font-semibold">
              Reminder delivery
            </h2>
            {can(actor, "mail.read") && mailListenerUrl() ? (
              <Link href="/settings/mail" className="text-sm underline">
                Mail received by the local listener
              </Link>
            ) : null}
          </div>
          <ReminderLog entries={log} />
        </section>
      ) : null}

      {view.done.length ? (
        <section aria-labelledby="done-heading" className="mt-8">
          <h2 id="done-heading" className="mb-3 text-lg font-semibold">
            Recently completed
          </h2>
          <ul className="flex flex-wrap gap-2 text-sm">
            {view.done.map((p) => (
              <li key={p.id}>
                <StatusBadge tone="ok">
                  {formatMonth(p.periodEnd)}: filed
                </StatusBadge>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </>
  );
}
