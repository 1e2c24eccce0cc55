import { route } from "@/lib/auth/route";
import { requestAddress } from "@/lib/accounts/address";
import { changePassword } from "@/lib/data/accounts";
import { changePasswordSchema } from "@/lib/validation/accounts";

/** Change one's own password (any member; the current password is required). Every session ends: sign in again. */
export const POST = route({ permission: "member", body: changePasswordSchema }, async ({ actor, body, request }) => {
  await changePassword(actor, body, requestAddress(request));
  return { ok: true, signInAgain: true };
});
