import { beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { freshDatabase } from "../helpers/db";
import { endSessionsOf } from "@/lib/data/sessions";
import { users } from "@/db/schema";
import type { Database } from "@/db/client";

let db: Database;
beforeAll(async () => {
  process.env.BALLAST_CLOCK = "2026-12-01";
  db = await freshDatabase();
});

describe("signing out through the sign-in service's own route", () => {
  it("moves the session version on, so a copied token stops working, and audits it", async () => {
    const [user] = await db.select().from(users).where(eq(users.email, "ada.quayle@northmoor.example"));
    expect(await endSessionsOf(user.id, user.sessionVersion)).toBe(true);
    const [after] = await db.select().from(users).where(eq(users.id, user.id));
    expect(after.sessionVersion).toBe(user.sessionVersion + 1);
    const audit = await db.$client.execute({ sql: "SELECT action FROM audit_events WHERE actor_id = ? AND action = 'session.sign_out'", args: [user.id] });
    expect(audit.rows).toHaveLength(1);
  });

  it("does nothing for a token already ended (the app's own sign-out moved the version first)", async () => {
    const [user] = await db.select().from(users).where(eq(users.email, "ada.quayle@northmoor.example"));
    const before = await db.$client.execute("SELECT COUNT(*) AS n FROM audit_events");
    expect(await endSessionsOf(user.id, user.sessionVersion - 1)).toBe(false);
    const [after] = await db.select().from(users).where(eq(users.id, user.id));
    expect(after.sessionVersion).toBe(user.sessionVersion);
    expect((await db.$client.execute("SELECT COUNT(*) AS n FROM audit_events")).rows[0].n).toBe(before.rows[0].n);
  });
});
