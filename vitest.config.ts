import { defineConfig } from "vitest/config";
import path from "node:path";

export default defineConfig({
  resolve: { alias: { "@": path.resolve(__dirname) } },
  test: {
    include: ["tests/unit/**/*.test.ts", "tests/reference/**/*.test.ts"],
    environment: "node",
    testTimeout: 30_000,
    pool: "forks",
  },
});
