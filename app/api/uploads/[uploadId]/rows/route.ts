import { route } from "@/lib/auth/route";
import { getUploadRows } from "@/lib/data/uploads";
import { idParam } from "@/lib/validation/firm";
import { rowsQuery } from "@/lib/validation/uploads";

/** One page of a pending upload's parsed rows (any member). */
export const GET = route({ permission: "member", params: idParam("uploadId"), query: rowsQuery }, ({ actor, params, query }) =>
  getUploadRows(actor, params.uploadId, query.page, query.pageSize),
);
