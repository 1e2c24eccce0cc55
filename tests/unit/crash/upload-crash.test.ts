import { describe, expect, it } from "vitest";
import { spawn } from "node:child_process";
import { existsSync, readFileSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { actorFor, freshDatabase } from "../helpers/db";
import { confirmUpload, listUploads } from "@/lib/data/uploads";
import { startUploadStandIn, storeFileInStandIn } from "@/scripts/upload-standin";

const ROWS = 150_000;

describe("crash consistency", () => {
  it("a process killed while confirming a large upload leaves all of it or none, and the upload can be confirmed after", async () => {
    process.env.BALLAST_CLOCK = "2026-12-01";
    const db = await freshDatabase();
    const url = process.env.DATABASE_URL!;
    const dbFile = url.slice("file:".length);
    const csv = path.join(path.dirname(dbFile), "large.csv");
    const lines = ["as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure"];
    for (let i = 0; i < ROWS; i++) lines.push(`2026-11-30,B${i % 5},EQ-${i},Name ${i},equity,EUR,${(i % 40) + 1},10,${((i % 40) + 1) * 10},`);
    writeFileSync(csv, lines.join("\n") + "\n");
    // The upload service keeps the file, as it would after a real upload.
    const storeDir = path.join(path.dirname(dbFile), "store");
    const token = Buffer.from(JSON.stringify({ apiKey: "sk_crash_test", appId: "crash", regions: ["local"] })).toString("base64");
    const store = await startUploadStandIn({ token, port: 0, dir: storeDir });
    storeFileInStandIn(storeDir, "crash", "large.csv", new Uint8Array(readFileSync(csv)));

    const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", path.join(__dirname, "confirm-child.ts"), csv, `${store.url}/f/crash`], {
      env: { ...process.env, DATABASE_URL: url },
      stdio: ["ignore", "pipe", "inherit"],
    });
    let uploadId = "";
    let finished = false;
    const exited = new Promise<void>((resolve) => child.on("exit", () => resolve()));
    await new Promise<void>((resolve) => {
      child.stdout.on("data", (chunk: Buffer) => {
        const text = chunk.toString();
        const match = /confirming (\S+)/.exec(text);
        if (match) {
          uploadId = match[1];
          // Kill as soon as the confirmation has started writing: the write-ahead log grows past its size at start.
          const wal = `${dbFile}-wal`;
          const start = existsSync(wal) ? statSync(wal).size : 0;
          const watch = setInterval(() => {
            if (finished || (existsSync(wal) && statSync(wal).size > start + 512 * 1024)) {
              clearInterval(watch);
              child.kill("SIGKILL");
              resolve();
            }
          }, 5);
        }
        if (text.includes("confirmed")) finished = true;
      });
      child.on("exit", () => resolve());
    });
    await exited;
    expect(uploadId).not.toBe("");

    // All or none: the upload is confirmed with every row, or still pending and none of its rows count (rows an
    // interrupted confirmation staged sit under an upload that is not confirmed, which no reader of the period reads).
    const officer = await actorFor("tomas.reyne@northmoor.example");
    const all = await listUploads(officer);
    const upload = all.find((u) => u.id === uploadId)!;
    const count = async () => Number((await db.$client.execute({ sql: "SELECT count(*) AS n FROM positions WHERE upload_id = ?", args: [uploadId] })).rows[0].n);
    const periodUploads = all.filter((u) => u.kind === "positions" && u.periodId === upload.periodId && u.id !== uploadId);
    if (upload.status === "confirmed") {
      expect(await count()).toBe(ROWS);
      expect(periodUploads.every((u) => u.status !== "confirmed")).toBe(true);
    } else {
      expect(upload.status).toBe("pending");
      // the period still counts what it had: no upload of it was superseded by this one
      expect(periodUploads.filter((u) => u.supersededBy === uploadId)).toHaveLength(0);
      // A person can carry on: confirming again works and stores everything once.
      const result = await confirmUpload(officer, uploadId, { acknowledgeWarnings: true });
      expect(result).toMatchObject({ status: "confirmed", stored: ROWS });
      expect(await count()).toBe(ROWS);
    }
    await store.close();
    const integrity = await db.$client.execute("PRAGMA integrity_check");
    expect(String(Object.values(integrity.rows[0])[0])).toBe("ok");
  }, 120_000);
});
