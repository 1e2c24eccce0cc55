import { mkdirSync, writeFileSync } from "node:fs";
import { test, expect, type Page } from "@playwright/test";
import { DEMO_USERS, SECOND_FIRM_USERS, signInThroughPage } from "./helpers";
import { describeFinding, horizontalOverflow, seriousViolations, type AxeFinding } from "./a11y";

/**
 * Accessibility: every signed-in page (app/(app)/**\/page.tsx), as every persona of both demo firms, and the
 * signed-out pages, checked with axe-core for serious and critical violations (WCAG 2.x A and AA). Read-only: it
 * visits what the demo seed holds (Northmoor's filed October with its run and filing, its open November).
 */

interface Ids {
  periods: { id: string; periodEnd: string }[];
  runs: { periodId: string; runId: string }[];
  methodId: string | null;
  uploadId: string | null;
}

/** The records this persona's firm holds, looked up through the API with the page's session. */
async function idsOf(page: Page): Promise<Ids> {
  const get = async <T,>(url: string): Promise<T> => {
    const response = await page.request.get(url);
    expect(response.status(), `${url}: ${await response.text()}`).toBe(200);
    return (await response.json()) as T;
  };
  const { periods } = await get<{ periods: { id: string; periodEnd: string }[] }>("/api/periods").catch(() => ({ periods: [] }));
  const runs: Ids["runs"] = [];
  for (const period of periods) {
    const listed = await page.request.get(`/api/periods/${period.id}/runs`);
    if (listed.status() !== 200) continue;
    const run = ((await listed.json()).runs as { id: string; status: string }[]).find((r) => r.status === "completed");
    if (run) runs.push({ periodId: period.id, runId: run.id });
  }
  const { versions } = await get<{ versions: { id: string }[] }>("/api/method");
  const { uploads } = await get<{ uploads: { id: string }[] }>("/api/uploads");
  return { periods, runs, methodId: versions[0]?.id ?? null, uploadId: uploads[0]?.id ?? null };
}

/** Every signed-in page with the ids filled in (each route of app/(app)/**\/page.tsx at least once). */
function pagesOf(ids: Ids): string[] {
  const pages = ["/home", "/data", "/periods", "/runs", "/method", "/method/compare", "/calendar", "/settings", "/settings/mail", "/audit"];
  // every page of the newest period; the filing page of each (a filed one reads differently from a draft)
  const [newest] = ids.periods;
  if (newest) pages.push(`/periods/${newest.id}`, `/periods/${newest.id}/data-quality`, `/periods/${newest.id}/runs`);
  for (const p of ids.periods) pages.push(`/periods/${p.id}/filing`);
  const run = ids.runs[0];
  if (run) {
    const base = `/periods/${run.periodId}/runs/${run.runId}`;
    pages.push(base, `${base}/factors`, `${base}/contributions`, `${base}/volatility`, `${base}/backtest`, `${base}/change`);
  }
  if (ids.methodId) pages.push(`/method/${ids.methodId}`);
  if (ids.uploadId) pages.push(`/data/uploads/${ids.uploadId}`);
  return pages;
}

/** Open a page and wait until its own requests have settled (client components load their data through the API). */
async function visit(page: Page, url: string): Promise<void> {
  const response = await page.goto(url);
  expect(response?.status(), `${url} answers`).toBeLessThan(400);
  await page.waitForLoadState("networkidle");
  await expect(page.locator("main#main, main").first()).toBeVisible();
}

test("the signed-out pages have no serious or critical accessibility violations", async ({ page }) => {
  const found: AxeFinding[] = [];
  for (const url of ["/", "/sign-in"]) {
    await visit(page, url);
    found.push(...(await seriousViolations(page, url)));
  }
  expect(found.map(describeFinding)).toEqual([]);
});

for (const person of [...DEMO_USERS, ...SECOND_FIRM_USERS]) {
  test(`every page as ${person.name} (${person.roles.join(", ")}) has no serious or critical accessibility violations`, async ({ page }, testInfo) => {
    test.setTimeout(240_000);
    await signInThroughPage(page, person.email);
    const ids = await idsOf(page);
    const pages = pagesOf(ids);
    expect(pages.length, "pages to check").toBeGreaterThanOrEqual(10);
    // React's hydration mismatches (minified in production as errors #418, #423 and #425) are logged as errors
    let at = "";
    const hydration: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error" && /hydrat|#418|#423|#425/i.test(m.text())) hydration.push(`${at}: ${m.text().slice(0, 200)}`);
    });
    page.on("pageerror", (e) => {
      if (/hydrat|#418|#423|#425/i.test(e.message)) hydration.push(`${at}: ${e.message.slice(0, 200)}`);
    });
    const found: AxeFinding[] = [];
    for (const url of pages) {
      at = url;
      await visit(page, url);
      found.push(...(await seriousViolations(page, url)));
    }
    mkdirSync(testInfo.outputDir, { recursive: true });
    writeFileSync(testInfo.outputPath("findings.txt"), found.map(describeFinding).join("\n") + "\n");
    expect(found.map(describeFinding), `${person.name}: ${pages.length} pages checked`).toEqual([]);
    expect(hydration, "no hydration errors").toEqual([]);
  });
}

test("on a 390 px phone screen the shell, the home page and the filing page fit the width; the menu opens and closes", async ({ page }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  const officer = DEMO_USERS.find((u) => u.roles.length === 1 && u.roles[0] === "compliance_officer")!;
  await signInThroughPage(page, officer.email);
  const ids = await idsOf(page);
  const filed = ids.periods.find((p) => p.periodEnd === "2026-10-31") ?? ids.periods[0];
  for (const url of ["/home", "/periods", `/periods/${filed.id}`, `/periods/${filed.id}/filing`, "/data", "/method"]) {
    await visit(page, url);
    const { scrollWidth, clientWidth } = await horizontalOverflow(page);
    expect(scrollWidth, `${url} is ${scrollWidth} px wide in a ${clientWidth} px window`).toBeLessThanOrEqual(clientWidth);
  }
  await page.screenshot({ path: "test-results/screens/phone-filing.png", fullPage: false });
  // the navigation folds behind a Menu button, which opens a list of links and closes on the way to a page
  const nav = page.getByRole("navigation", { name: "Month end" });
  const menu = nav.getByRole("button", { name: /Menu/ });
  await expect(menu).toHaveAttribute("aria-expanded", "false");
  await expect(nav.getByRole("link", { name: "Periods" })).toBeHidden();
  await menu.focus();
  await page.keyboard.press("Enter");
  await expect(menu).toHaveAttribute("aria-expanded", "true");
  await page.screenshot({ path: "test-results/screens/phone-menu.png", fullPage: false });
  await nav.getByRole("link", { name: "Periods" }).click();
  await expect(page).toHaveURL(/\/periods$/);
  await expect(menu).toHaveAttribute("aria-expanded", "false");
  const { scrollWidth, clientWidth } = await horizontalOverflow(page);
  expect(scrollWidth).toBeLessThanOrEqual(clientWidth);
});
