import { uploadActionRoutes } from "@/lib/uploads/routes";

/** Confirm a pending positions upload (one transaction; warnings must be acknowledged). */
export const POST = uploadActionRoutes("positions").confirm;
