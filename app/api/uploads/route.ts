import { route } from "@/lib/auth/route";
import { listUploads } from "@/lib/data/uploads";
import { uploadListQuery } from "@/lib/validation/uploads";

/** The firm's uploads, newest first (any member). */
export const GET = route({ permission: "member", query: uploadListQuery }, async ({ actor, query }) => ({ uploads: await listUploads(actor, query) }));
