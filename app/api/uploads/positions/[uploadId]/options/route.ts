import { uploadActionRoutes } from "@/lib/uploads/routes";

/** Change how a pending positions upload is read (number format, column mapping) and re-check it. */
export const PUT = uploadActionRoutes("positions").options;
