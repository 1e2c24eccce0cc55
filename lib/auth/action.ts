/**
 * The server-action wrapper: the same gate and zod validation as route handlers, answering with a plain
 * result object that forms can show field by field.
 */
import "server-only";
import type { z } from "zod";
import { AppError, toAppError, type FieldErrors } from "@/lib/errors";
import { requireActor, type Actor } from "./actor";
import type { Permission } from "./permissions";
import { fieldErrors } from "./route";

export type ActionResult<T = undefined> =
  | { ok: true; data: T }
  | { ok: false; error: { code: string; message: string; fields?: FieldErrors } };

/** Wrap a server action: resolve the actor, check the permission, validate the input, catch AppErrors. */
export function action<S extends z.ZodType, T>(
  permission: Permission | "member",
  schema: S,
  handler: (input: z.infer<S>, actor: Actor) => Promise<T>,
) {
  return async (input: unknown): Promise<ActionResult<T>> => {
    try {
      const actor = await requireActor(permission === "member" ? undefined : permission);
      const parsed = schema.safeParse(input);
      if (!parsed.success) {
        throw new AppError("unprocessable:form", "Some values are not valid.", fieldErrors(parsed.error));
      }
      return { ok: true, data: await handler(parsed.data, actor) };
    } catch (error) {
      const appError = toAppError(error);
      return { ok: false, error: appError.toBody().error };
    }
  };
}
