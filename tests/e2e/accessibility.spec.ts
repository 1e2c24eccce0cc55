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

/** Every signed-in route (app/(app)/**\/page.tsx), with how to fill in its ids; null when the firm has no such record. */
const ROUTES: { route: string; urls: (ids: Ids) => string[] }[] = [
  ...["/home", "/data", "/periods", "/runs", "/method", "/method/compare", "/calendar", "/settings", "/settings/mail", "/audit"].map((route) => ({ route, urls: () => [route] })),
  { route: "/periods/[periodId]", urls: (ids) => ids.periods.slice(0, 1).map((p) => `/periods/${p.id}`) },
  { route: "/periods/[periodId]/data-quality", urls: (ids) => ids.periods.slice(0, 1).map((p) => `/periods/${p.id}/data-quality`) },
  // each period's filing: a filed one reads differently from an open one
  { route: "/periods/[periodId]/filing", urls: (ids) => ids.periods.map((p) => `/periods/${p.id}/filing`) },
  { route: "/periods/[periodId]/runs", urls: (ids) => ids.periods.slice(0, 1).map((p) => `/periods/${p.id}/runs`) },
  ...["", "/factors", "/contributions", "/volatility", "/backtest", "/change"].map((tab) => ({
    route: `/periods/[periodId]/runs/[runId]${tab}`,
    urls: (ids: Ids) => ids.runs.slice(0, 1).map((r) => `/periods/${r.periodId}/runs/${r.runId}${tab}`),
  })),
  { route: "/method/[methodId]", urls: (ids) => (ids.methodId ? [`/method/${ids.methodId}`] : []) },
  { route: "/data/uploads/[uploadId]", urls: (ids) => (ids.uploadId ? [`/data/uploads/${ids.uploadId}`] : []) },
];

/** Open a page and wait until its own requests have settled (client components load their data through the API). */
async function visit(page: Page, url: string): Promise<void> {
  const response = await page.goto(url);
  expect(response?.status(), `${url} answers`).toBeLessThan(400);
  await page.waitForLoadState("networkidle");
  await expect(page.locator("main").first()).toBeVisible();
}

/** React's hydration mismatches (minified in production as errors #418, #423 and #425) are logged as errors. */
const HYDRATION = /hydrat|#418|#423|#425/i;

test("the signed-out pages have no serious or critical accessibility violations", async ({ page }) => {
  const found: AxeFinding[] = [];
  for (const url of ["/", "/sign-in"]) {
    await visit(page, url);
    found.push(...(await seriousViolations(page, url)));
  }
  expect(found.map(describeFinding)).toEqual([]);
});

for (const person of [...DEMO_USERS, ...SECOND_FIRM_USERS]) {
  test.describe(`as ${person.name} (${person.roles.join(", ")})`, () => {
    let page: Page;
    let ids: Ids;
    const hydration: string[] = [];
    let at = "";
    test.beforeAll(async ({ browser }) => {
      page = await (await browser.newContext()).newPage();
      page.on("console", (m) => {
        if (m.type() === "error" && HYDRATION.test(m.text())) hydration.push(`${at}: ${m.text().slice(0, 200)}`);
      });
      page.on("pageerror", (e) => {
        if (HYDRATION.test(e.message)) hydration.push(`${at}: ${e.message.slice(0, 200)}`);
      });
      await signInThroughPage(page, person.email);
      ids = await idsOf(page);
    });
    test.afterAll(async () => {
      await page?.context().close();
    });
    for (const { route, urls } of ROUTES) {
      test(`${route}: no serious or critical accessibility violations, no hydration error`, async () => {
        const found: AxeFinding[] = [];
        hydration.length = 0;
        for (const url of urls(ids)) {
          at = url;
          await visit(page, url);
          found.push(...(await seriousViolations(page, url)));
        }
        expect(found.map(describeFinding)).toEqual([]);
        expect(hydration, "no hydration errors").toEqual([]);
      });
    }
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
    const { scrollWidth, clientWidth, widest } = await horizontalOverflow(page);
    expect(scrollWidth, `${url} is ${scrollWidth} px wide in a ${clientWidth} px window: ${widest.join("; ")}`).toBeLessThanOrEqual(clientWidth);
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
