/**
 * `npm run demo`: settings on first run, a fresh demo database (migrated and seeded), a production build when
 * the sources changed, then the app on http://localhost:3000 (PORT to change it), listening on loopback only unless
 * DEMO_HOST says otherwise. Ctrl-C stops everything.
 */
import { spawn, spawnSync } from "node:child_process";
import { existsSync, statSync, readdirSync } from "node:fs";
import path from "node:path";
import { ensureLocalEnv } from "./local-env";
import { startLocalUploadService } from "./local-services";
import { startLocalMail } from "./mail-listener";
import { startWorkerBeside } from "./worker";
import { DEMO_USERS, SECOND_FIRM_USERS, DEMO_PASSWORD } from "../db/seed";

const root = process.cwd();
const nextBin = path.join(root, "node_modules", "next", "dist", "bin", "next");

function run(args: string[], label: string): void {
  const result = spawnSync(process.execPath, args, { stdio: "inherit", env: process.env });
  if (result.status !== 0) {
    console.error(`demo: ${label} failed (exit ${result.status}).`);
    process.exit(result.status ?? 1);
  }
}

/** Newest modification time under the folders a build depends on. */
function newestSource(): number {
  let newest = 0;
  const walk = (dir: string) => {
    if (!existsSync(dir)) return;
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else newest = Math.max(newest, statSync(full).mtimeMs);
    }
  };
  for (const dir of ["app", "lib", "db", "reports", "templates"]) walk(path.join(root, dir));
  for (const file of ["package.json", "next.config.ts", "tailwind.config.ts", "proxy.ts"]) {
    if (existsSync(file)) newest = Math.max(newest, statSync(file).mtimeMs);
  }
  return newest;
}

ensureLocalEnv();
// The demo firm's data is fixed to the November 2026 month end, so the demo's "today" is the day after it. Set
// BALLAST_CLOCK yourself to walk it on another day.
process.env.BALLAST_CLOCK ??= "2026-12-01";
process.env.BALLAST_ALLOW_CLOCK ??= "1";
run(["--conditions=react-server", "--import", "tsx", "db/seed.ts"], "seeding the demo database");

const buildId = path.join(root, ".next", "BUILD_ID");
if (!existsSync(buildId) || statSync(buildId).mtimeMs < newestSource()) {
  console.log("Building the app (about a minute the first time)…");
  run([nextBin, "build"], "the production build");
}

const port = process.env.PORT ?? "3000";
// Loopback only: the demo's passwords are published. DEMO_HOST=0.0.0.0 (or an address) serves it further, knowingly.
const host = process.env.DEMO_HOST?.trim() || "127.0.0.1";
console.log(`
Ballast demo on http://localhost:${port}${host === "127.0.0.1" ? " (this computer only; DEMO_HOST to serve it further)" : ` (listening on ${host}: anyone who can reach it can sign in with the demo passwords)`}
Every demo user's password: ${DEMO_PASSWORD}   (demo only)
${[...DEMO_USERS, ...SECOND_FIRM_USERS].map((u) => `  ${u.email.padEnd(34)} ${u.roles.join(" + ")}`).join("\n")}
`);
void Promise.all([startLocalUploadService(), startLocalMail()]).then(() => {
  // The production web tier (scripts/serve.ts): WEB_CONCURRENCY web processes, one per core unless it says otherwise.
  const server = spawn(process.execPath, ["--import", "tsx", path.join(root, "scripts", "serve.ts")], { stdio: "inherit", env: { ...process.env, PORT: port, HOST: host } });
  // One job worker (npm run worker) with the same settings: it computes runs and sends the reminder round every
  // REMINDERS_INTERVAL_MINUTES (10). More workers: `npm run worker` in another terminal.
  startWorkerBeside(server);
});
