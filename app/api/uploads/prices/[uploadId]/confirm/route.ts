import { uploadActionRoutes } from "@/lib/uploads/routes";

/** Confirm a pending prices upload (one transaction; warnings must be acknowledged). */
export const POST = uploadActionRoutes("prices").confirm;
