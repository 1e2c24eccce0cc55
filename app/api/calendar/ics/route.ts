import { route } from "@/lib/auth/route";
import { firmDeadlinesIcs } from "@/lib/calendar/view";

/** The firm's filing deadlines as an iCalendar (.ics) file, for people's own calendars. */
export const GET = route({ permission: "periods.read" }, async ({ actor }) => {
  const slug = actor.firmName.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "firm";
  return new Response(await firmDeadlinesIcs(actor), {
    headers: {
      "content-type": "text/calendar; charset=utf-8",
      "content-disposition": `attachment; filename="${slug}-filing-deadlines.ics"`,
      "cache-control": "private, no-store",
    },
  });
});
