import { after } from "next/server";
import { route } from "@/lib/auth/route";
import { requestAddress } from "@/lib/accounts/address";
import { RESET_ANSWER, requestPasswordReset } from "@/lib/data/accounts";
import { resetRequestSchema } from "@/lib/validation/accounts";

/** Ask for a password-reset link (public). The same answer for any address; the mail goes out after the answer. */
export const POST = route({ permission: "public", body: resetRequestSchema }, async ({ body, request }) => {
  const job = await requestPasswordReset(body.email, requestAddress(request));
  after(() => job().catch((error) => console.error("[accounts] reset request failed:", error instanceof Error ? error.message : error)));
  return Response.json({ message: RESET_ANSWER }, { status: 202 });
});
