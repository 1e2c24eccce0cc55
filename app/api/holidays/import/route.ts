import { route } from "@/lib/auth/route";
import { importHolidayCsv } from "@/lib/data/calendar-settings";
import { holidayCsvSchema } from "@/lib/calendar/validation";

/** Take a holiday CSV (date,name per row); any bad row refuses the whole file and stores nothing (administrators). */
export const POST = route({ permission: "calendar.manage", body: holidayCsvSchema }, ({ actor, body }) => importHolidayCsv(actor, body));
