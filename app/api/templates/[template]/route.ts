import { readFile } from "node:fs/promises";
import path from "node:path";
import { z } from "zod";
import { route } from "@/lib/auth/route";

const TEMPLATES = ["positions.csv", "prices-long.csv", "prices-wide.csv"] as const;

/** Blank upload templates (any member). */
export const GET = route({ permission: "member", params: z.object({ template: z.enum(TEMPLATES) }) }, async ({ params }) => {
  const file = await readFile(path.join(process.cwd(), "templates", "uploads", params.template));
  return new Response(file, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="ballast-${params.template}"`,
    },
  });
});
