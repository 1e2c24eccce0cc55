import { route } from "@/lib/auth/route";
import { getUploadPreview } from "@/lib/data/uploads";
import { idParam } from "@/lib/validation/firm";

/** One upload with its problems and totals (any member). */
export const GET = route({ permission: "member", params: idParam("uploadId") }, ({ actor, params }) => getUploadPreview(actor, params.uploadId));
