import { describe, expect, it } from "vitest";
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { ROUTES } from "../permission-table";

/** Every exported HTTP method of every route.ts under app/api, as "METHOD /api/path". */
function discoverRoutes(): string[] {
  const found: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const full = path.join(dir, name);
      if (statSync(full).isDirectory()) walk(full);
      else if (name === "route.ts") {
        const source = readFileSync(full, "utf8");
        const methods = new Set<string>();
        for (const m of source.matchAll(/export (?:const|async function|function) (GET|POST|PATCH|PUT|DELETE)\b/g)) methods.add(m[1]);
        for (const m of source.matchAll(/export (?:const )?\{([^}]*)\}/g)) {
          for (const name of m[1].split(",").map((s) => s.trim())) if (/^(GET|POST|PATCH|PUT|DELETE)$/.test(name)) methods.add(name);
        }
        const routePath = "/" + path.relative(path.resolve("app"), path.dirname(full)).split(path.sep).join("/");
        for (const method of methods) found.push(`${method} ${routePath}`);
      }
    }
  };
  walk(path.resolve("app/api"));
  return found.sort();
}

describe("permission table", () => {
  it("has an entry for every route handler, and no entry without a route", () => {
    const discovered = discoverRoutes();
    const listed = ROUTES.map((r) => `${r.method} ${r.path}`).sort();
    expect(discovered.length).toBeGreaterThan(5);
    expect(listed).toEqual(discovered);
  });

  it("gives every write route an invalid body to probe the gate with", () => {
    for (const r of ROUTES.filter((r) => r.method !== "GET" && !r.external)) {
      expect(r.invalidBody, `${r.method} ${r.path}`).toBeDefined();
      if (r.scoped) expect(r.validBody, `${r.method} ${r.path}`).toBeDefined();
    }
  });
});
