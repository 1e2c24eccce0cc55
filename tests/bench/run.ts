/**
 * `npm run bench`: runs every suite in tests/bench/suites in its own process (so peak memory is per suite)
 * and passes through its output: one JSON object a line with at least name, value (median), unit, runs.
 * Pass suite names to run only those, e.g. `npm run bench -- volatility`.
 * Every file of suites/ is a suite, e.g. suites/load-50-users.ts (`npm run bench -- load-50-users`: the web tier and a
 * worker under 50 signed-in sessions while a 200,000-position run and a 40 MB price import execute).
 */
import { readdirSync } from "node:fs";
import { spawnSync } from "node:child_process";
import path from "node:path";

const dir = path.join(__dirname, "suites");
const only = process.argv.slice(2);
const suites = readdirSync(dir)
  .filter((f) => f.endsWith(".ts"))
  .filter((f) => only.length === 0 || only.some((o) => f.includes(o)))
  .sort();
let failed = 0;
for (const file of suites) {
  const result = spawnSync(process.execPath, ["--conditions=react-server", "--import", "tsx", "--expose-gc", path.join(dir, file)], {
    stdio: ["ignore", "inherit", "inherit"],
  });
  if (result.status !== 0) {
    failed++;
    process.stderr.write(`bench: suite ${file} exited with ${result.status}\n`);
  }
}
process.exit(failed ? 1 : 0);
