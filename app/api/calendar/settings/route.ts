import { route } from "@/lib/auth/route";
import { getReminderSettings, updateReminderSettings } from "@/lib/data/calendar-settings";
import { reminderSettingsSchema } from "@/lib/calendar/validation";

/** The reminder schedule and automatic opening (administrators). */
export const GET = route({ permission: "calendar.manage" }, ({ actor }) => getReminderSettings(actor));

/** Change the reminder schedule: business days before the deadline (each 1..60), the overdue notice, automatic opening. */
export const PUT = route({ permission: "calendar.manage", body: reminderSettingsSchema }, ({ actor, body }) => updateReminderSettings(actor, body));
