/** Loopback stand-ins the demo and development start beside the app (upload service). */
import { startUploadStandIn } from "./upload-standin";

/** Start the upload stand-in when the local settings ask for it (UPLOAD_STANDIN=1). */
export async function startLocalUploadService(): Promise<void> {
  if (process.env.UPLOAD_STANDIN !== "1") return;
  const port = Number(new URL(process.env.UPLOADTHING_INGEST_URL ?? "http://127.0.0.1:4010").port || 4010);
  const standIn = await startUploadStandIn({ token: process.env.UPLOADTHING_TOKEN!, port, dir: process.env.UPLOAD_STANDIN_DIR ?? "data/uploads" });
  console.log(`Upload service stand-in on ${standIn.url}`);
}
