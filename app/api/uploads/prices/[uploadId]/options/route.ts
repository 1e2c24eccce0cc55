import { uploadActionRoutes } from "@/lib/uploads/routes";

/** Change how a pending prices upload is read (number format, column mapping) and re-check it. */
export const PUT = uploadActionRoutes("prices").options;
