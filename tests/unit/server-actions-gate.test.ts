import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";

/**
 * Server actions are endpoints too. Every module marked "use server" may export only functions that go through
 * the gate: each exported action must call a wrapper made by `action(permission, schema, …)` from lib/auth/action.ts
 * (the wrapper resolves the actor and checks the permission before anything else). A new action without it fails here.
 */
function serverActionFiles(dir: string, found: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) {
      if (name !== "node_modules" && !name.startsWith(".")) serverActionFiles(full, found);
    } else if (/\.(ts|tsx)$/.test(name) && /^\s*["']use server["']/m.test(readFileSync(full, "utf8"))) found.push(full);
  }
  return found;
}

describe("server actions go through the gate", () => {
  const files = [...serverActionFiles(path.resolve("app")), ...serverActionFiles(path.resolve("lib"))];

  it("finds the server actions", () => {
    expect(files.length).toBeGreaterThan(0);
  });

  for (const file of files) {
    it(path.relative(process.cwd(), file), () => {
      const source = readFileSync(file, "utf8");
      const wrappers = [...source.matchAll(/const (\w+) = action\(\s*"([\w.]+)"/g)].map((m) => m[1]);
      expect(source).toMatch(/from "@\/lib\/auth\/action"/);
      const exported = [...source.matchAll(/export (?:async )?function (\w+)\s*\(([^)]*)\)[^{]*\{([\s\S]*?)\n\}/g)];
      expect(exported.length).toBeGreaterThan(0);
      for (const [, name, , body] of exported) {
        const gated = wrappers.some((w) => new RegExp(`\\b${w}\\(`).test(body));
        expect(gated, `${name} in ${path.basename(file)} must call an action() wrapper first`).toBe(true);
      }
      expect(source, "no exported arrow-function actions that skip the check").not.toMatch(/export const \w+ = async/);
    });
  }
});
