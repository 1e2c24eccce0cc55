import { z } from "zod";
import { route } from "@/lib/auth/route";
import { requestAddress } from "@/lib/accounts/address";
import { setPasswordWithToken } from "@/lib/data/accounts";
import { tokenPasswordSchema } from "@/lib/validation/accounts";

const body = z.intersection(tokenPasswordSchema, z.object({ purpose: z.enum(["invite", "reset"], { message: "purpose: invite or reset." }) }));

/** Choose a password through a single-use invitation or reset link (public; the token is the credential). */
export const POST = route({ permission: "public", body }, async ({ body, request }) => {
  const { email } = await setPasswordWithToken(body.token, body.purpose, body.password, requestAddress(request));
  return { ok: true, email };
});
