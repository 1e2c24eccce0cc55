/**
 * The import graph (madge, type-only imports left out, since they vanish at build time): no module imports itself
 * through others, and the engine, the data layer, the packs and the database code import nothing from app/ (the
 * caution text, labels and other shared words live in lib/domain/).
 */
import { describe, expect, it } from "vitest";
import madge from "madge";

const ROOTS = ["lib", "reports", "db", "app", "scripts"];

let built: ReturnType<typeof madge> | undefined;

/** The graph, built once for both checks. */
function graph() {
  built ??= madge(ROOTS, {
    fileExtensions: ["ts", "tsx"],
    tsConfig: "tsconfig.json",
    excludeRegExp: [/node_modules/, /\.next/],
    detectiveOptions: { ts: { skipTypeImports: true }, tsx: { skipTypeImports: true } },
  });
  return built;
}

describe("import graph", () => {
  it("has no cycle", { timeout: 120_000 }, async () => {
    const result = await graph();
    expect(Object.keys(result.obj()).length).toBeGreaterThan(300);
    expect(result.circular()).toEqual([]);
  });

  it("lib/, reports/ and db/ import nothing from app/", { timeout: 120_000 }, async () => {
    const deps = (await graph()).obj();
    const offending = Object.entries(deps)
      .filter(([file]) => /^(lib|reports|db)\//.test(file))
      .flatMap(([file, imports]) => imports.filter((d) => d.startsWith("app/")).map((d) => `${file} imports ${d}`));
    expect(offending).toEqual([]);
  });
});
