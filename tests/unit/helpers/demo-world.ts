/** The demo database with the demo price history and positions loaded, and (when asked) the approved demo method. */
import { worldDatabase } from "./db";
import type { Database } from "@/db/client";

/** A private copy of the loaded demo world (clock pinned to 2026-12-01), with or without the seeded method. */
export function demoDatabase(options: { withMethod: boolean }): Promise<Database> {
  return worldDatabase(options.withMethod ? "method" : "loaded", { clock: "2026-12-01" });
}
