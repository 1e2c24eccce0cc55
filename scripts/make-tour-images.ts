/**
 * Small images of the main screens for the README's tour, cut from the screenshots the browser tests take
 * (test-results/screens): the top of each page, 960 px wide. `npx tsx scripts/make-tour-images.ts` after `npm test`.
 */
import { chromium } from "@playwright/test";
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";

const SCREENS = ["landing", "shell-compliance_officer", "data-page", "upload-bad-positions", "data-quality", "method-page", "run-summary", "run-volatility", "run-backtest", "filing-in-review", "filing-signed", "audit-trail"];

(async () => {
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: ["--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage"] });
  const page = await browser.newPage({ viewport: { width: 960, height: 640 } });
  for (const name of SCREENS) {
    const source = path.join("test-results", "screens", `${name}.png`);
    if (!existsSync(source)) {
      console.warn(`missing ${source}: run the browser tests first`);
      continue;
    }
    const data = readFileSync(source).toString("base64");
    await page.setContent(`<html><body style="margin:0"><img style="width:960px;display:block" src="data:image/png;base64,${data}"></body></html>`);
    await page.screenshot({ path: path.join("tests", "e2e", "tour", `${name}.png`), clip: { x: 0, y: 0, width: 960, height: 640 } });
  }
  await browser.close();
})();
