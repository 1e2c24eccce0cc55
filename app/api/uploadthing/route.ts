// The upload service's endpoints (presigned URLs, completion callbacks). Each upload route's middleware runs the
// gate (lib/auth/actor.ts); the callback is verified by the service's signature.
import { createRouteHandler } from "uploadthing/next";
import { uploadRouter } from "./core";
import { cappedRequest } from "@/lib/auth/request-guard";
import { toAppError } from "@/lib/errors";

// Warnings and errors only: at the library's default ("Info") every upload logs its presigned URLs, which carry
// their signatures, into the server log.
const handlers = createRouteHandler({ router: uploadRouter, config: { logLevel: "Warning" } });
export const GET = handlers.GET;

/** The files themselves go to the upload service; what comes here is small JSON, so over 1 MiB is refused (413). */
export async function POST(request: Request): Promise<Response> {
  let capped: Request;
  try {
    capped = await cappedRequest(request);
  } catch (error) {
    return toAppError(error).toResponse();
  }
  return handlers.POST(capped as Parameters<typeof handlers.POST>[0]);
}
