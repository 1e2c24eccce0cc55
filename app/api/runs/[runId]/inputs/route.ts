import { route } from "@/lib/auth/route";
import { exportRunInputs } from "@/lib/data/runs";
import { idParam } from "@/lib/validation/firm";

/**
 * The run's stored inputs as one JSON download (any member who reads periods); `npm run engine -- run --inputs FILE
 * --json` recomputes the run from it. Every export is recorded in the audit trail.
 */
export const GET = route({ permission: "periods.read", params: idParam("runId") }, async ({ actor, params }) => {
  const file = await exportRunInputs(actor, params.runId);
  return new Response(Buffer.from(file.bytes), {
    status: 200,
    headers: {
      "content-type": `${file.contentType}; charset=utf-8`,
      "content-disposition": `attachment; filename="${file.fileName}"`,
      "content-length": String(file.bytes.byteLength),
      "cache-control": "no-store",
      "x-content-type-options": "nosniff",
    },
  });
});
