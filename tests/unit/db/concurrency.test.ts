import { describe, expect, it } from "vitest";
import { createClient } from "@libsql/client";
import { serialiseWrites, WriteQueue } from "@/db/client";
import { freshDatabase } from "../helpers/db";

describe("SQLite under concurrent writers", () => {
  it("runs in WAL mode, and writers from several connections wait their turn instead of failing", async () => {
    const db = await freshDatabase();
    const url = process.env.DATABASE_URL!;
    const mode = await db.$client.execute("PRAGMA journal_mode");
    expect(String(Object.values(mode.rows[0])[0])).toBe("wal");
    // Six connections in one process, as concurrent requests share one server (one write queue per process), each
    // writing 40 rows in small transactions interleaved with plain writes outside any transaction.
    const queue = new WriteQueue();
    const clients = Array.from({ length: 6 }, () => serialiseWrites(createClient({ url, timeout: 5000 }), queue));
    await Promise.all(
      clients.map(async (client, c) => {
        for (let i = 0; i < 40; i++) {
          const tx = await client.transaction("write");
          await tx.execute({ sql: "INSERT INTO holidays (id, firm_id, date, name, created_at) VALUES (?, 'f-concurrency', ?, 'x', 'now')", args: [`c${c}-${i}`, `2031-${String((i % 12) + 1).padStart(2, "0")}-${String(c + 1).padStart(2, "0")}-${i}`] });
          await tx.commit();
          await client.execute({ sql: "UPDATE holidays SET name = ? WHERE id = ?", args: [`n${i}`, `c${c}-${i}`] });
        }
      }),
    );
    for (const client of clients) client.close();
    const { rows } = await db.$client.execute("SELECT count(*) AS n FROM holidays WHERE firm_id = 'f-concurrency'");
    expect(Number(rows[0].n)).toBe(240);
  });
});

describe("the app's own database handle", () => {
  it("lets many concurrent transactions and plain writes through without a busy error", async () => {
    const db = await freshDatabase();
    const { holidays } = await import("@/db/schema");
    await Promise.all(
      Array.from({ length: 30 }, (_, i) =>
        i % 3 === 0
          ? db.insert(holidays).values({ firmId: "f-app", date: `2032-01-${String((i % 28) + 1).padStart(2, "0")}-${i}`, name: "plain" })
          : db.transaction(async (tx) => {
              await tx.insert(holidays).values({ firmId: "f-app", date: `2032-02-${i}`, name: "tx-a" });
              await tx.select().from(holidays).limit(1);
              await tx.insert(holidays).values({ firmId: "f-app", date: `2032-03-${i}`, name: "tx-b" });
            }),
      ),
    );
    const { rows } = await db.$client.execute("SELECT count(*) AS n FROM holidays WHERE firm_id = 'f-app'");
    expect(Number(rows[0].n)).toBe(10 + 20 * 2);
  });
});
