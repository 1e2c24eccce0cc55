import AxeBuilder from "@axe-core/playwright";
import { expect, type Page } from "@playwright/test";

/** The axe rule tags checked: WCAG 2.0, 2.1 and 2.2 at levels A and AA, and axe's own best practices. */
export const AXE_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa", "best-practice"];

/** One violation found by axe, in a line a person can act on. */
export interface AxeFinding {
  page: string;
  rule: string;
  impact: string;
  help: string;
  targets: string[];
}

/**
 * The serious and critical accessibility violations axe-core finds on the page as it stands (minor and moderate
 * ones are not counted). Each finding names the rule and the elements.
 */
export async function seriousViolations(page: Page, label = page.url()): Promise<AxeFinding[]> {
  const result = await new AxeBuilder({ page }).withTags(AXE_TAGS).analyze();
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => ({
      page: label,
      rule: v.id,
      impact: v.impact ?? "",
      help: v.help,
      targets: v.nodes.slice(0, 5).map((n) => n.target.join(" ")),
    }));
}

/** Fail with every serious or critical violation on the page listed (rule, help text, elements). */
export async function expectNoSeriousViolations(page: Page, label = page.url()): Promise<void> {
  const found = await seriousViolations(page, label);
  expect(found.map(describeFinding), `accessibility violations on ${label}`).toEqual([]);
}

/** A finding as one line. */
export function describeFinding(f: AxeFinding): string {
  return `${f.page}: [${f.impact}] ${f.rule}: ${f.help} (${f.targets.join(", ")})`;
}

/** The page is no wider than the window: nothing makes the reader scroll sideways. */
export async function horizontalOverflow(page: Page): Promise<{ scrollWidth: number; clientWidth: number; widest: string[] }> {
  return page.evaluate(() => {
    const clientWidth = document.documentElement.clientWidth;
    // the elements that reach past the window's right edge and are not inside a scrolling box (to name the culprit)
    const widest = [...document.querySelectorAll("body *")]
      .filter((el) => el.getBoundingClientRect().right > clientWidth + 1)
      .filter((el) => {
        for (let p = el.parentElement; p; p = p.parentElement) if (["auto", "scroll", "hidden"].includes(getComputedStyle(p).overflowX)) return false;
        return true;
      })
      .slice(-5)
      .map((el) => `${el.tagName.toLowerCase()}.${[...el.classList].slice(0, 4).join(".")} (${Math.round(el.getBoundingClientRect().right)} px)`);
    return { scrollWidth: document.documentElement.scrollWidth, clientWidth, widest };
  });
}
