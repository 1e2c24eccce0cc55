import { route } from "@/lib/auth/route";
import { requestAddress } from "@/lib/accounts/address";
import { completeFirstRun } from "@/lib/data/accounts";
import { firstRunSchema } from "@/lib/validation/accounts";

/** The first run of an empty install (public, once): the first firm and its administrator. Refused afterwards. */
export const POST = route({ permission: "public", body: firstRunSchema }, async ({ body, request }) =>
  Response.json(await completeFirstRun(body, requestAddress(request)), { status: 201 }),
);
