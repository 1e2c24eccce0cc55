// The upload service's endpoints (presigned URLs, completion callbacks). Each upload route's middleware runs the
// gate (lib/auth/actor.ts); the callback is verified by the service's signature.
import { createRouteHandler } from "uploadthing/next";
import { uploadRouter } from "./core";

export const { GET, POST } = createRouteHandler({ router: uploadRouter });
