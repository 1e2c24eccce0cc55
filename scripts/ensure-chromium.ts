/**
 * Browser tests drive Debian's Chromium (never a downloaded browser build). Install it through apt when it is
 * missing; a fresh machine has only Node and npm.
 */
import { existsSync } from "node:fs";
import { spawnSync } from "node:child_process";

const CHROMIUM = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

function sh(command: string): number {
  return spawnSync("bash", ["-c", command], { stdio: "inherit" }).status ?? 1;
}

if (existsSync(CHROMIUM)) {
  process.exit(0);
}
console.log(`Chromium not found at ${CHROMIUM}; installing Debian's chromium package…`);
const sudo = process.getuid?.() === 0 ? "" : "sudo ";
if (sh(`${sudo}apt-get -o DPkg::Lock::Timeout=900 update -qq`) !== 0 || sh(`${sudo}DEBIAN_FRONTEND=noninteractive apt-get -o DPkg::Lock::Timeout=900 install -y -qq chromium`) !== 0) {
  console.error("Could not install Chromium with apt-get. Install Debian's chromium package, or set CHROMIUM_PATH.");
  process.exit(1);
}
if (!existsSync(CHROMIUM)) {
  console.error(`apt-get finished but ${CHROMIUM} is still missing.`);
  process.exit(1);
}
