import { route } from "@/lib/auth/route";
import { listReminderLog } from "@/lib/data/reminder-log";

/** The firm's latest reminders with their delivery status and last error (administrators). */
export const GET = route({ permission: "calendar.manage" }, async ({ actor }) => ({ reminders: await listReminderLog(actor) }));
