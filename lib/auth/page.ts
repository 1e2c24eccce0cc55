/** The gate for server-rendered pages: signed-out visitors go to sign-in; a missing permission is reported. */
import "server-only";
import { notFound, redirect } from "next/navigation";
import { AppError } from "@/lib/errors";
import { getActor, type Actor } from "./actor";
import { can, type Permission } from "./permissions";

/** The actor of a page, or a redirect to sign-in; `allowed` is false when the roles lack `permission`. */
export async function pageActor(permission?: Permission): Promise<{ actor: Actor; allowed: boolean }> {
  const actor = await getActor();
  if (!actor) redirect("/sign-in");
  return { actor, allowed: permission ? can(actor, permission) : true };
}

/** A page's read, with another firm's or a missing record shown as the not-found page (every other error is thrown on). */
export async function orNotFound<T>(read: Promise<T>): Promise<T> {
  try {
    return await read;
  } catch (error) {
    if (error instanceof AppError && error.kind === "not_found") notFound();
    throw error;
  }
}
