/** `npm run dev`: settings on first run, migrations applied, then `next dev` with hot reload and one job worker. */
import { spawn, spawnSync } from "node:child_process";
import path from "node:path";
import { ensureLocalEnv } from "./local-env";
import { startLocalUploadService } from "./local-services";
import { startLocalMail } from "./mail-listener";
import { startWorkerBeside } from "./worker";

ensureLocalEnv();
const migrated = spawnSync(process.execPath, ["--import", "tsx", "db/migrate.ts"], { stdio: "inherit", env: process.env });
if (migrated.status !== 0) process.exit(migrated.status ?? 1);
void Promise.all([startLocalUploadService(), startLocalMail()]).then(() => {
  const server = spawn(process.execPath, [path.join("node_modules", "next", "dist", "bin", "next"), "dev", "-p", process.env.PORT ?? "3000"], {
    stdio: "inherit",
    env: process.env,
  });
  // one job worker (npm run worker) on the same settings: it computes runs and sends the reminder rounds
  startWorkerBeside(server);
});
