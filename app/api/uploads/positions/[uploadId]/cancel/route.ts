import { uploadActionRoutes } from "@/lib/uploads/routes";

/** Cancel a pending positions upload; nothing of it is stored. */
export const POST = uploadActionRoutes("positions").cancel;
