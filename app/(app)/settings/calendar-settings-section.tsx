import Link from "next/link";
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/permissions";
import { getReminderSettings, listHolidays } from "@/lib/data/calendar-settings";
import { mailListenerUrl } from "@/lib/mail/inbox";
import { ReminderScheduleForm } from "./reminder-schedule-form";
import { HolidaysPanel } from "./holidays-panel";

/** Settings → Filing calendar (administrators): the reminder schedule and the holiday list. The deadline rule is in the firm form above. */
export async function CalendarSettingsSection({ actor }: { actor: Actor }) {
  const [reminders, holidays] = await Promise.all([getReminderSettings(actor), listHolidays(actor)]);
  return (
    <section aria-labelledby="calendar-heading" className="mt-10">
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="calendar-heading" className="text-lg font-semibold">
          Filing calendar
        </h2>
        <p className="text-sm">
          <Link href="/calendar" className="underline">
            See the calendar and reminder delivery
          </Link>
          {can(actor, "mail.read") && mailListenerUrl() ? (
            <>
              {" · "}
              <Link href="/settings/mail" className="underline">
                Mail received
              </Link>
            </>
          ) : null}
        </p>
      </div>
      <div className="grid gap-8 xl:grid-cols-2">
        <div>
          <h3 className="mb-2 font-medium">Reminders</h3>
          <ReminderScheduleForm initial={reminders} />
        </div>
        <div>
          <h3 className="mb-2 font-medium">Holidays</h3>
          <HolidaysPanel initial={holidays} />
        </div>
      </div>
    </section>
  );
}
