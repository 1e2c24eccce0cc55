// The upload service's endpoints (presigned URLs, completion callbacks). Each upload route's middleware runs the
// gate (lib/auth/actor.ts); the callback is verified by the service's signature.
import { createRouteHandler } from "uploadthing/next";
import { uploadRouter } from "./core";

// Warnings and errors only: at the library's default ("Info") every upload logs its presigned URLs, which carry
// their signatures, into the server log.
export const { GET, POST } = createRouteHandler({ router: uploadRouter, config: { logLevel: "Warning" } });
