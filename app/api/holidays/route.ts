import { route } from "@/lib/auth/route";
import { listHolidays, replaceHolidays } from "@/lib/data/calendar-settings";
import { holidayListSchema } from "@/lib/calendar/validation";

/** The firm's holidays (days that are not business days, beyond weekends). */
export const GET = route({ permission: "periods.read" }, async ({ actor }) => ({ holidays: await listHolidays(actor) }));

/** Replace the holiday list with the edited one (administrators). */
export const PUT = route({ permission: "calendar.manage", body: holidayListSchema }, async ({ actor, body }) => ({ holidays: await replaceHolidays(actor, body) }));
