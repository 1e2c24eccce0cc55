/**
 * "Export inputs": a run's stored inputs as one JSON download, audited; `npm run engine -- run --inputs FILE --json`
 * recomputes the run from it outside the app and prints the same results, bit for bit.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq } from "drizzle-orm";
import { actorFor, demoWorldAs, PEOPLE } from "./setup";
import { auditEvents } from "@/db/schema";
import { exportRunInputs, getRun, startRun } from "@/lib/data/runs";
import { executeRun } from "@/lib/data/run-execution";
import { compareRuns } from "@/lib/runs/compare";
import { RUN_INPUTS_FORMAT } from "@/lib/runs/export";
import { AppError } from "@/lib/errors";
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";
import type { RunResults } from "@/lib/runs/types";

const root = process.cwd();
let db: Database;
let analyst: Actor;
let runId: string;

beforeAll(async () => {
  let periodId: string;
  ({ db, periodId, analyst } = await demoWorldAs({ withMethod: true }, { analyst: PEOPLE.analyst }));
  const run = await startRun(analyst, periodId, { excludeShortHistory: true });
  expect(await executeRun(run.id)).toBe("completed");
  runId = run.id;
}, 300_000);

describe("export of a run's inputs", () => {
  it("downloads the stored inputs with the recorded hashes and audits the export", async () => {
    const file = await exportRunInputs(analyst, runId);
    expect(file.fileName).toMatch(/^run-inputs-\d{4}-\d{2}-\d{2}-[0-9a-f]{8}\.json$/);
    const json = JSON.parse(Buffer.from(file.bytes).toString("utf8"));
    expect(json.format).toBe(RUN_INPUTS_FORMAT);
    expect(json.runId).toBe(runId);
    const run = await getRun(analyst, runId);
    expect(json.inputHashes).toEqual(run.inputHashes);
    const audits = await db.select().from(auditEvents).where(and(eq(auditEvents.entityId, runId), eq(auditEvents.action, "run.export_inputs")));
    expect(audits).toHaveLength(1);
    expect(audits[0].firmId).toBe(analyst.firmId);
  });

  it("refuses another firm's run as not found", async () => {
    const pellam = await actorFor(PEOPLE.pellamAnalyst);
    await expect(exportRunInputs(pellam, runId)).rejects.toSatisfy((e: unknown) => e instanceof AppError && e.code.startsWith("not_found"));
  });

  it("recomputes on the command line to the stored results, bit for bit", async () => {
    const file = await exportRunInputs(analyst, runId);
    const dir = mkdtempSync(join(tmpdir(), "ballast-run-inputs-"));
    const path = join(dir, file.fileName);
    writeFileSync(path, file.bytes);
    const r = spawnSync("npx", ["tsx", "lib/engine-cli.ts", "run", "--inputs", path, "--json"], { cwd: root, encoding: "utf8", maxBuffer: 256 * 1024 * 1024 });
    expect(r.stderr).toBe("");
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as { inputHashesMatchRecorded: boolean; results: RunResults; engineVersion: string };
    expect(out.inputHashesMatchRecorded).toBe(true);
    const run = await getRun(analyst, runId);
    // every figure identical (compareRuns compares each number, string and flag); and the whole JSON the same text
    const check = compareRuns({ id: run.id, results: run.results!, inputHashes: run.inputHashes, engineVersion: run.engineVersion }, { results: out.results, inputHashes: run.inputHashes!, engineVersion: out.engineVersion });
    expect(check.differences).toEqual([]);
    expect(check.matches).toBe(true);
    expect(JSON.stringify(out.results)).toBe(JSON.stringify(run.results));
  }, 120_000);

  it("exits 1 with one line naming the problem for a file that is not a run's inputs", () => {
    const dir = mkdtempSync(join(tmpdir(), "ballast-run-inputs-"));
    const path = join(dir, "bad.json");
    writeFileSync(path, JSON.stringify({ format: RUN_INPUTS_FORMAT, runId: "x", inputs: { positions: [] } }));
    const r = spawnSync("npx", ["tsx", "lib/engine-cli.ts", "run", "--inputs", path, "--json"], { cwd: root, encoding: "utf8" });
    expect(r.status).toBe(1);
    expect(r.stdout).toBe("");
    expect(r.stderr.trim().split("\n")).toEqual([`engine: --inputs: ${path}: the inputs have no "prices"`]);
  });
});
