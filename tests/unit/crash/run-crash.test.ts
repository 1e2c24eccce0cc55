import { describe, expect, it } from "vitest";
import { spawn } from "node:child_process";
import path from "node:path";
import { runsDatabase, actorFor, PEOPLE, demoPeriodId } from "../runs/setup";
import { getRun, startRun } from "@/lib/data/runs";

describe("crash consistency of runs", () => {
  it("a worker killed while a run computes leaves the run without half-stored results; it is marked interrupted and a new run can start", async () => {
    const db = await runsDatabase({ withMethod: true });
    const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", path.join(__dirname, "run-child.ts")], {
      env: { ...process.env },
      stdio: ["ignore", "pipe", "inherit"],
    });
    const exited = new Promise<void>((resolve) => child.on("exit", () => resolve()));
    const runId = await new Promise<string>((resolve) => {
      child.stdout.on("data", (chunk: Buffer) => {
        const match = /started (\S+)/.exec(chunk.toString());
        if (match) {
          // The run's job is claimed by the child's worker; kill the process as it starts computing.
          child.kill("SIGKILL");
          resolve(match[1]);
        }
      });
    });
    await exited;

    const { rows } = await db.$client.execute({ sql: "SELECT status, results, finished_at FROM runs WHERE id = ?", args: [runId] });
    const [row] = rows;
    if (row.status === "completed") {
      // The kill came after the last write: then everything is there.
      expect(row.results).not.toBeNull();
    } else {
      expect(["queued", "running"]).toContain(row.status);
      expect(row.results).toBeNull();
      // The worker's lease runs out with no heartbeat (back-dated here instead of waiting the 15 s lease).
      await db.$client.execute({ sql: "UPDATE jobs SET lease_expires_at = '2000-01-01T00:00:00.000Z' WHERE dedupe_key = ? AND state = 'running'", args: [`run:${runId}`] });
      const analyst = await actorFor(PEOPLE.analyst);
      const interrupted = await getRun(analyst, runId);
      expect(interrupted.status).toBe("failed");
      expect(interrupted.error).toMatch(/^Interrupted/);
      // A person can carry on: a new run for the period starts.
      const again = await startRun(analyst, await demoPeriodId(db, analyst), { excludeShortHistory: true });
      expect(again.status).toBe("queued");
    }
    const integrity = await db.$client.execute("PRAGMA integrity_check");
    expect(String(Object.values(integrity.rows[0])[0])).toBe("ok");
  }, 120_000);
});
