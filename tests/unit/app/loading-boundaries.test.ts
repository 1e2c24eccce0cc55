/**
 * A loading.tsx makes its segment stream: everything under it answers 200 before it renders. A page that must answer a
 * real 404 (another firm's record) decides that in a layout above every loading boundary, or in a segment with none.
 * So no loading.tsx may sit above a dynamic segment ([id]) other than one whose layout has already decided, and no
 * loading.tsx may sit beside a page that calls notFound itself.
 */
import { describe, expect, it } from "vitest";
import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";

const ROOT = path.join(process.cwd(), "app", "(app)");

function walk(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? [full, ...walk(full)] : [];
  });
}

/** Pages whose only not-found case a layout above their loading boundary has already answered with a real 404. */
const DECIDED_ABOVE: Record<string, string> = {
  "periods/[periodId]/data-quality": "its only not-found is the period's, which periods/[periodId]/layout.tsx answers first",
  "periods/[periodId]/filing": "its only not-found is the period's, which periods/[periodId]/layout.tsx answers first",
};

const decidesNotFound = (file: string) => existsSync(file) && /\b(orNotFound|notFound)\(/.test(readFileSync(file, "utf8"));

describe("loading boundaries", () => {
  const segments = [ROOT, ...walk(ROOT)];
  const withLoading = segments.filter((dir) => existsSync(path.join(dir, "loading.tsx")));

  it("there are some (the check below has something to check)", () => {
    expect(withLoading.length).toBeGreaterThan(5);
  });

  it("no loading.tsx above a segment that decides a 404, nor beside a page that does", () => {
    const offending: string[] = [];
    for (const dir of withLoading) {
      const rel = path.relative(ROOT, dir) || ".";
      if (decidesNotFound(path.join(dir, "page.tsx")) && !DECIDED_ABOVE[rel]) offending.push(`${rel}: its page calls notFound`);
      for (const below of walk(dir)) {
        if (decidesNotFound(path.join(below, "layout.tsx")) || decidesNotFound(path.join(below, "page.tsx"))) {
          offending.push(`${rel}: ${path.relative(ROOT, below)} below it calls notFound`);
        }
      }
    }
    expect(offending).toEqual([]);
  });
});
