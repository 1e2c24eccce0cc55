import { timingSafeEqual, createHash } from "node:crypto";
import { fieldErrors, route } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { cronRequestSchema } from "@/lib/calendar/validation";
import { runReminders } from "@/lib/data/reminders";

/** Whether the request carries the scheduler secret (compared in constant time). */
function hasSecret(request: Request): boolean {
  const secret = process.env.REMINDERS_SECRET;
  const header = request.headers.get("authorization") ?? "";
  const match = /^Bearer (.+)$/.exec(header.trim());
  if (!secret || !match) return false;
  const digest = (value: string) => createHash("sha256").update(value).digest();
  return timingSafeEqual(digest(match[1]), digest(secret));
}

/** Whether a caller may name the day to act as (test-only, like BALLAST_CLOCK). */
const clockAllowed = () => process.env.NODE_ENV !== "production" || process.env.BALLAST_ALLOW_CLOCK === "1";

/**
 * Run the reminder scheduler once, for hosted schedulers. Not a signed-in route: it checks its own secret
 * (REMINDERS_SECRET, sent as `authorization: Bearer …`); a missing or unknown one gets 401. The optional JSON body
 * `{ "asOf": "yyyy-mm-dd" }` is test-only and refused unless the server allows a pinned clock.
 */
export const POST = route({ permission: "public" }, async ({ request }) => {
  if (!hasSecret(request)) {
    throw new AppError(
      "unauthorized:scheduler",
      process.env.REMINDERS_SECRET ? "Send the scheduler secret as `authorization: Bearer <REMINDERS_SECRET>`." : "The scheduler is not enabled on this server (REMINDERS_SECRET is not set).",
    );
  }
  const text = await request.text();
  let raw: unknown = {};
  if (text.trim()) {
    try {
      raw = JSON.parse(text);
    } catch {
      throw new AppError("bad_request:body", "The request body is not valid JSON.");
    }
  }
  const parsed = cronRequestSchema.safeParse(raw);
  if (!parsed.success) {
    const fields = fieldErrors(parsed.error);
    throw new AppError("unprocessable:body", `Some values are not valid: ${Object.entries(fields).map(([k, v]) => `${k}: ${v}`).join("; ")}`, fields);
  }
  if (parsed.data.asOf && !clockAllowed()) {
    throw new AppError("unprocessable:body", "asOf is a test-only setting; this server refuses it (BALLAST_ALLOW_CLOCK is not 1).", { asOf: "Not allowed on this server." });
  }
  return runReminders({ asOf: parsed.data.asOf });
});
