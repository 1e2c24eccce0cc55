/**
 * The confirm / cancel / re-read route handlers of one kind of upload. Positions and price history get their own
 * routes so that each route's permission is exact in the permission table.
 */
import "server-only";
import { route } from "@/lib/auth/route";
import { assertUploadKind, cancelUpload, requestConfirm, updateUploadOptions, UPLOAD_PERMISSION as PERMISSION, type UploadKind } from "@/lib/data/uploads";
import { idParam } from "@/lib/validation/firm";
import { cancelUploadSchema, confirmUploadSchema, uploadOptionsSchema } from "@/lib/validation/uploads";

/** Route handlers for confirming, cancelling and re-reading uploads of `kind`. */
export function uploadActionRoutes(kind: UploadKind) {
  const params = idParam("uploadId");
  return {
    confirm: route({ permission: PERMISSION[kind], params, body: confirmUploadSchema }, async ({ actor, params, body }) => {
      await assertUploadKind(actor, params.uploadId, kind);
      return requestConfirm(actor, params.uploadId, body);
    }),
    cancel: route({ permission: PERMISSION[kind], params, body: cancelUploadSchema }, async ({ actor, params }) => {
      await assertUploadKind(actor, params.uploadId, kind);
      return cancelUpload(actor, params.uploadId);
    }),
    options: route({ permission: PERMISSION[kind], params, body: uploadOptionsSchema }, async ({ actor, params, body }) => {
      await assertUploadKind(actor, params.uploadId, kind);
      return updateUploadOptions(actor, params.uploadId, body);
    }),
  };
}
