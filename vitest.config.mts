import { defineConfig } from "vitest/config";
import path from "node:path";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";

const __dirname = path.dirname(fileURLToPath(import.meta.url));

const TEST_FILES = ["tests/unit/**/*.test.ts", "tests/reference/**/*.test.ts"];
/** Files that replace a module with vi.mock: a mock must not meet a module another file loaded, nor outlive its file. */
const ISOLATED_FILES = ["tests/unit/auth/route-caching.test.ts", "tests/unit/app/error-pages.test.ts"];

export default defineConfig({
  resolve: {
    alias: {
      "@": path.resolve(__dirname),
      // "server-only" throws outside React's server build; unit tests call server modules directly.
      "server-only": path.resolve(__dirname, "tests/unit/server-only-stub.ts"),
    },
  },
  test: {
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
    // Each test file starts from the environment its worker was forked with (tests/unit/helpers/per-file.ts).
    setupFiles: ["tests/unit/helpers/per-file.ts"],
    projects: [
      {
        extends: true,
        test: {
          name: "shared",
          include: TEST_FILES,
          exclude: ISOLATED_FILES,
          // A worker runs file after file on the modules it has loaded (about 90 s of imports saved across the suite).
          // Safe because the data layer opens the database at DATABASE_URL afresh when a file points it elsewhere,
          // every id is random, no module reads the environment when it loads, and per-file.ts resets the
          // environment; a file that replaces a module (vi.mock) runs in the isolated project instead.
          isolate: false,
        },
      },
      { extends: true, test: { name: "isolated", include: ISOLATED_FILES, isolate: true } },
    ],
  },
});
