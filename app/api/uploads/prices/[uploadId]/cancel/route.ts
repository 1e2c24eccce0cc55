import { uploadActionRoutes } from "@/lib/uploads/routes";

/** Cancel a pending prices upload; nothing of it is stored. */
export const POST = uploadActionRoutes("prices").cancel;
