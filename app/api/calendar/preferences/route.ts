import { route } from "@/lib/auth/route";
import { getMyReminderPreference, setMyReminderPreference } from "@/lib/data/calendar-settings";
import { reminderPreferenceSchema } from "@/lib/calendar/validation";

/** Whether I receive reminder e-mails (any member, for themselves). */
export const GET = route({ permission: "member" }, ({ actor }) => getMyReminderPreference(actor));

/** Turn my reminder e-mails on or off; overdue notices still arrive. */
export const PUT = route({ permission: "member", body: reminderPreferenceSchema }, ({ actor, body }) => setMyReminderPreference(actor, body.remindersEnabled));
