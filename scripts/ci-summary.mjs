// Sums the vitest and Playwright JSON reports into CI's plain closing line: "N passed, N failed".
// A failing step that produced no report (install, type-check, lint, build) counts as one failure.
import { existsSync, readFileSync } from "node:fs";

const exitStatus = Number(process.argv[2] ?? 0);
let passed = 0;
let failed = 0;
let reports = 0;

const vitest = ".test-output/vitest.json";
if (existsSync(vitest)) {
  const r = JSON.parse(readFileSync(vitest, "utf8"));
  passed += r.numPassedTests ?? 0;
  failed += r.numFailedTests ?? 0;
  reports++;
}

const e2e = ".test-output/e2e.json";
if (existsSync(e2e)) {
  const r = JSON.parse(readFileSync(e2e, "utf8"));
  passed += r.stats?.expected ?? 0;
  failed += (r.stats?.unexpected ?? 0) + (r.stats?.flaky ?? 0);
  reports++;
}

if (exitStatus !== 0 && failed === 0) failed = 1; // a step failed before or outside the test reports
if (reports < 2 && exitStatus === 0) {
  console.error("ci: a test report is missing although the test command succeeded");
  failed += 1;
}
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 ? 1 : 0);
