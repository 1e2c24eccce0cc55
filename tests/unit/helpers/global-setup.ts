/** vitest globalSetup: builds the template worlds once per run (see tests/unit/helpers/template-worlds.ts). */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { buildTemplates, TEMPLATE_DIR_VAR } from "./template-worlds";

export default async function setup(): Promise<() => void> {
  // Every project of the config (tests of shared and of isolated modules) calls the set-up; the first one builds.
  if (process.env[TEMPLATE_DIR_VAR]) return () => undefined;
  const dir = mkdtempSync(path.join(tmpdir(), "ballast-templates-"));
  await buildTemplates(dir);
  // Workers are forked after the global set-up and inherit this process's environment.
  process.env[TEMPLATE_DIR_VAR] = dir;
  return () => rmSync(dir, { recursive: true, force: true });
}
