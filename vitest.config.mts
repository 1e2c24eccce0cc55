import { defineConfig } from "vitest/config";
import path from "node:path";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";

const __dirname = path.dirname(fileURLToPath(import.meta.url));

export default defineConfig({
  resolve: {
    alias: {
      "@": path.resolve(__dirname),
      // "server-only" throws outside React's server build; unit tests call server modules directly.
      "server-only": path.resolve(__dirname, "tests/unit/server-only-stub.ts"),
    },
  },
  test: {
    include: ["tests/unit/**/*.test.ts", "tests/reference/**/*.test.ts"],
    environment: "node",
    // Builds the template worlds (migrated / seeded / loaded / method databases) once per run; each test file opens a
    // copy (tests/unit/helpers/template-worlds.ts) instead of migrating and seeding its own.
    globalSetup: ["tests/unit/helpers/global-setup.ts"],
    testTimeout: 30_000,
    // Several files build a seeded database world in beforeAll (migrations, seed, confirmed uploads, a run). On an
    // idle machine that takes 2–6 s; on a busy one (a build beside it, CI sharing two cores) several times that.
    // The hook's limit is there to catch a hang, not to measure speed (speed belongs in npm run bench).
    hookTimeout: 180_000,
    pool: "forks",
    // One worker per core (vitest's default leaves one core idle, which on a 2-core machine runs the files one at a
    // time): every file opens its own copy of a template database and listens on port 0, so files run side by side.
    maxWorkers: availableParallelism(),
    reporters: ["default", ["json", { outputFile: ".test-output/vitest.json" }]],
  },
});
