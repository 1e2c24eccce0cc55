import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { route } from "@/lib/auth/route";
import { APP_VERSION } from "@/lib/version";

export const dynamic = "force-dynamic";

/** Liveness for monitors: the app's version and whether the database answers. No sign-in. */
export const GET = route({ permission: "public" }, async () => {
  let database: "ok" | "unavailable" = "ok";
  try {
    await getDb().run(sql`select 1`);
  } catch {
    database = "unavailable";
  }
  return Response.json({ status: database === "ok" ? "ok" : "degraded", version: APP_VERSION, database }, { status: database === "ok" ? 200 : 503 });
});
