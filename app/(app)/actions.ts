"use server";

import { cookies } from "next/headers";
import { signOut } from "@/lib/auth";
import { action } from "@/lib/auth/action";
import { FIRM_COOKIE } from "@/lib/auth/actor";
import { endSessionOfActor } from "@/lib/data/sessions";
import { z } from "zod";

/**
 * Sign out: the session cookie is cleared and the person's session version is bumped, so any copy of the
 * session token stops working on the server too.
 */
const endSession = action("member", z.object({}), async (_input, actor) => {
  await endSessionOfActor(actor);
});

export async function signOutAction(): Promise<void> {
  await endSession({});
  await signOut({ redirectTo: "/sign-in" });
}

/** Switch the firm a person works for (only among their own memberships; the gate re-checks on every request). */
const chooseFirm = action("member", z.object({ firmId: z.string().uuid() }), async ({ firmId }, actor) => {
  if (!actor.firms.some((f) => f.id === firmId)) return false;
  (await cookies()).set(FIRM_COOKIE, firmId, { httpOnly: true, sameSite: "lax", path: "/" });
  return true;
});

export async function switchFirmAction(formData: FormData): Promise<void> {
  // A call with anything but a form (a hand-made request) is refused by the schema, not a crash.
  await chooseFirm({ firmId: formData instanceof FormData ? formData.get("firmId") : undefined });
}
