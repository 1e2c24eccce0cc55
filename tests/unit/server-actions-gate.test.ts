import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { checkServerActionSource } from "./helpers/server-action-gate";

/**
 * Server actions are endpoints too. Every export of a module marked "use server" (and every function with its own
 * "use server" directive) must go through the gate: be an `action(permission, schema, …)` wrapper from
 * lib/auth/action.ts, or call one as its first statement (the wrapper resolves the actor and checks the permission
 * before anything else). The checker reads the TypeScript syntax tree (tests/unit/helpers/server-action-gate.ts),
 * so `export default`, `export { x }`, `export { x as y }`, arrow functions and re-exports are all seen.
 */
function sourceFiles(dir: string, found: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) {
      if (name !== "node_modules" && !name.startsWith(".")) sourceFiles(full, found);
    } else if (/\.(ts|tsx)$/.test(name) && readFileSync(full, "utf8").includes("use server")) found.push(full);
  }
  return found;
}

const HEAD = `"use server";\nimport { z } from "zod";\nimport { action } from "@/lib/auth/action";\nconst gate = action("member", z.object({}), async () => 1);\n`;
const check = (body: string, head = HEAD) => checkServerActionSource(head + body).exports;
const gated = (body: string, head = HEAD) => Object.fromEntries(check(body, head).map((e) => [e.name, e.gated]));

describe("the checker itself, on small modules", () => {
  it("a named function that calls the wrapper first passes; one that does not fails", () => {
    expect(gated(`export async function ok() { await gate({}); }\nexport async function bad() { return 1; }`)).toEqual({ ok: true, bad: false });
  });

  it("the wrapper must come first, not after other work", () => {
    expect(gated(`export async function late() { await fetch("x"); await gate({}); }`)).toEqual({ late: false });
    expect(gated(`export async function first() { const r = await gate({}); return r; }`)).toEqual({ first: true });
  });

  it("default exports: a wrapped and an unwrapped function, a wrapper, a named local", () => {
    expect(gated(`export default async function () { return gate({}); }`)).toEqual({ default: true });
    expect(gated(`export default async function handler() { return 1; }`)).toEqual({ default: false });
    expect(gated(`export default async () => 1;`)).toEqual({ default: false });
    expect(gated(`export default action("member", z.object({}), async () => 2);`)).toEqual({ default: true });
    expect(gated(`async function open() { return 1; }\nexport default open;`)).toEqual({ default: false });
    expect(gated(`const viaGate = async () => gate({});\nexport default viaGate;`)).toEqual({ default: true });
  });

  it("named re-exports of local bindings: export { x } and export { x as y }", () => {
    expect(gated(`async function open() { return 1; }\nasync function shut() { await gate({}); }\nexport { open, shut as close };`)).toEqual({ open: false, close: true });
    expect(gated(`export { gate as signOut };`)).toEqual({ signOut: true });
  });

  it("exported arrows and consts: the wrapper itself passes, a bare arrow or a value fails, a let is refused", () => {
    expect(gated(`export const a = action("member", z.object({}), async () => 3);\nexport const b = async () => 1;\nexport const c = 5;\nexport const d = gate;`))
      .toEqual({ a: true, b: false, c: false, d: true });
    expect(check(`export let e = gate;`)[0]).toMatchObject({ name: "e", gated: false, reason: expect.stringMatching(/let or var/) });
  });

  it("re-exports from another module are refused (the checker cannot see them gated)", () => {
    expect(check(`export { thing } from "./elsewhere";\nexport * from "./more";`)).toEqual([
      { name: "thing", gated: false, reason: expect.stringMatching(/re-exported from \.\/elsewhere/) },
      { name: "*", gated: false, reason: expect.stringMatching(/re-exported from \.\/more/) },
    ]);
  });

  it("type exports are ignored; an action() not imported from lib/auth/action does not count", () => {
    expect(check(`export type T = number;\nexport interface I { a: number }\nexport async function ok() { await gate({}); }`).map((e) => e.name)).toEqual(["ok"]);
    const foreign = `"use server";\nimport { action } from "./my-own-action";\nconst gate = action("member", {}, async () => 1);\n`;
    expect(gated(`export async function f() { await gate({}); }`, foreign)).toEqual({ f: false });
    expect(gated(`export async function f() { await gate({}); }`, `"use server";\nimport { action as wrap } from "@/lib/auth/action";\nconst gate = wrap("member", {}, async () => 1);\n`)).toEqual({ f: true });
  });

  it("a module without the directive has no server-action exports, but an inline \"use server\" function is checked", () => {
    const plain = `import { action } from "@/lib/auth/action";\nconst gate = action("member", {}, async () => 1);\n`;
    expect(check(`export async function helper() { return 1; }`, plain)).toEqual([]);
    expect(gated(`export function Form() { async function save() { "use server"; return 1; } async function ok() { "use server"; await gate({}); } return [save, ok]; }`, plain))
      .toEqual({ 'save (inline "use server")': false, 'ok (inline "use server")': true });
    // the directive only counts in the prologue: after another statement it is a plain string
    expect(checkServerActionSource(`import x from "y";\n"use server";\nexport async function f() { return 1; }`).moduleDirective).toBe(false);
  });
});

describe("server actions go through the gate", () => {
  const files = [...sourceFiles(path.resolve("app")), ...sourceFiles(path.resolve("lib"))];
  const reports = files
    .map((file) => ({ file, report: checkServerActionSource(readFileSync(file, "utf8"), file) }))
    .filter(({ report }) => report.moduleDirective || report.exports.length > 0); // not just the words in a comment

  it("finds the server actions", () => {
    expect(reports.some((r) => r.report.moduleDirective && r.report.exports.length > 0)).toBe(true);
  });

  for (const { file, report } of reports) {
    it(path.relative(process.cwd(), file), () => {
      for (const e of report.exports) expect(e.gated, `${e.name} in ${path.basename(file)} ${e.reason}`).toBe(true);
    });
  }
});
