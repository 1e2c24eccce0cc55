/**
 * Per-file set-up (vitest setupFiles, run before every test file). In the shared project a worker runs one file after
 * another in the same process, so what a file sets in the environment (BALLAST_CLOCK, DATABASE_URL, the stand-in's
 * folder, SMTP settings) would reach the next file: each file starts from the environment the worker was forked with.
 */
const worker = globalThis as typeof globalThis & { ballastForkedEnv?: Record<string, string | undefined> };
worker.ballastForkedEnv ??= { ...process.env };
for (const key of Object.keys(process.env)) if (!(key in worker.ballastForkedEnv)) delete process.env[key];
Object.assign(process.env, worker.ballastForkedEnv);
