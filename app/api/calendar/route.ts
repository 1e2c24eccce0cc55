import { route } from "@/lib/auth/route";
import { calendarView } from "@/lib/calendar/view";

/** The firm's open and coming deadlines, business days left, state and who owns the next step. */
export const GET = route({ permission: "periods.read" }, ({ actor }) => calendarView(actor));
