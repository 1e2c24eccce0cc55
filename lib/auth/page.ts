/** The gate for server-rendered pages: signed-out visitors go to sign-in; a missing permission is reported. */
import "server-only";
import { redirect } from "next/navigation";
import { getActor, type Actor } from "./actor";
import { can, type Permission } from "./permissions";

/** The actor of a page, or a redirect to sign-in; `allowed` is false when the roles lack `permission`. */
export async function pageActor(permission?: Permission): Promise<{ actor: Actor; allowed: boolean }> {
  const actor = await getActor();
  if (!actor) redirect("/sign-in");
  return { actor, allowed: permission ? can(actor, permission) : true };
}
