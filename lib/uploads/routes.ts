/**
 * The confirm / cancel / re-read route handlers of one kind of upload. Positions and price history get their own
 * routes so that each route's permission is exact in the permission table.
 */
import "server-only";
import { route } from "@/lib/auth/route";
import { cancelUpload, requestConfirm, updateUploadOptions, type UploadKind } from "@/lib/data/uploads";
import { idParam } from "@/lib/validation/firm";
import { cancelUploadSchema, confirmUploadSchema, uploadOptionsSchema } from "@/lib/validation/uploads";
import { getDb } from "@/db/client";
import { uploads } from "@/db/schema";
import { and, eq } from "drizzle-orm";
import { AppError } from "@/lib/errors";
import type { Actor } from "@/lib/auth/actor";

const PERMISSION = { positions: "positions.upload", prices: "prices.upload" } as const;

async function assertKind(actor: Actor, uploadId: string, kind: UploadKind) {
  const [row] = await getDb().select({ kind: uploads.kind }).from(uploads).where(and(eq(uploads.id, uploadId), eq(uploads.firmId, actor.firmId)));
  if (!row || row.kind !== kind) throw new AppError("not_found:upload", "No such upload.");
}

/** Route handlers for confirming, cancelling and re-reading uploads of `kind`. */
export function uploadActionRoutes(kind: UploadKind) {
  const params = idParam("uploadId");
  return {
    confirm: route({ permission: PERMISSION[kind], params, body: confirmUploadSchema }, async ({ actor, params, body }) => {
      await assertKind(actor, params.uploadId as string, kind);
      return requestConfirm(actor, params.uploadId as string, body);
    }),
    cancel: route({ permission: PERMISSION[kind], params, body: cancelUploadSchema }, async ({ actor, params }) => {
      await assertKind(actor, params.uploadId as string, kind);
      return cancelUpload(actor, params.uploadId as string);
    }),
    options: route({ permission: PERMISSION[kind], params, body: uploadOptionsSchema }, async ({ actor, params, body }) => {
      await assertKind(actor, params.uploadId as string, kind);
      return updateUploadOptions(actor, params.uploadId as string, body);
    }),
  };
}
