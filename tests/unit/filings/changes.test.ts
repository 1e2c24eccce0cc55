/**
 * "Changes since the last filing": against the signed filing of the earlier period (capital, VaR, ES, exceptions,
 * method version, and the split of the VaR change from the runs' own explain), and against the previous version.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { attestation, completedRun, filingWorld, type FilingWorld } from "./setup";
import { storeFileInStandIn } from "@/scripts/upload-standin";
import { formatAmount } from "@/reports/format";
import type { FilingViewModel } from "@/reports/view-model";

let w: FilingWorld;
let october: FilingViewModel;
let november: FilingViewModel;
const data = () => import("@/lib/data/filings");

/** October's positions loaded and confirmed the way db/seed-uploads.ts loads November's. */
async function loadOctoberPositions(periodId: string) {
  const { receiveUploadBytes, confirmUpload } = await import("@/lib/data/uploads");
  const fileName = "northmoor-positions-2026-10.csv";
  const bytes = new Uint8Array(readFileSync(path.join("templates", "demo", fileName)));
  const key = randomBytes(12).toString("hex");
  storeFileInStandIn(process.env.UPLOAD_STANDIN_DIR!, key, fileName, bytes);
  const { uploadId } = await receiveUploadBytes(
    { firmId: w.officer.firmId, userId: w.officer.userId, userName: w.officer.name, periodId, kind: "positions", numberFormat: "plain" },
    { key, name: fileName, ufsUrl: `http://127.0.0.1:4010/f/${key}` },
    bytes,
  );
  await confirmUpload(w.officer, uploadId, { acknowledgeWarnings: true });
}

beforeAll(async () => {
  w = await filingWorld();
  const { openPeriod } = await import("@/lib/data/periods");
  const { prepareFiling, submitFiling, signFiling } = await data();
  // October: opened, loaded, run, filed and signed
  const oct = await openPeriod(w.officer, "2026-10");
  await loadOctoberPositions(oct.id);
  await completedRun(w.analyst, oct.id);
  const octFiling = await prepareFiling(w.officer, oct.id);
  await submitFiling(w.officer, octFiling.id);
  october = (await signFiling(w.head, octFiling.id, attestation(w.head))).content;
  // November, from the run filingWorld marked
  november = (await prepareFiling(w.officer, w.periodId)).content;
}, 120_000);

describe("against the earlier period's signed filing", () => {
  it("states capital, VaR and ES then and now, from the two filings' own figures", () => {
    const lines = november.filing.changesSinceLast;
    const ccy = "EUR";
    expect(lines[0]).toBe(
      `Capital: ${formatAmount(october.figures.capital.capital)} ${ccy} in the filing for October 2026 (version 1, signed), ${formatAmount(november.figures.capital.capital)} ${ccy} now (${november.figures.capital.capital >= october.figures.capital.capital ? "+" : ""}${formatAmount(november.figures.capital.capital - october.figures.capital.capital)}).`,
    );
    const var1d = (vm: FilingViewModel) => vm.figures.totals.find((t) => t.primary)!.byConfidence.find((c) => c.confidence === vm.figures.capitalConfidence)!.oneDay.var;
    expect(lines[1]).toContain(`${formatAmount(var1d(october))} → ${formatAmount(var1d(november))} ${ccy}`);
  });

  it("splits the VaR change into positions, volatilities and correlations, in the explain's stated order", () => {
    const line = november.filing.changesSinceLast.find((l) => l.startsWith("The change in one-day parametric VaR"));
    expect(line).toBeDefined();
    expect(line).toMatch(/splits into positions [+−]?[\d,]+, volatilities [+−]?[\d,]+, correlations [+−]?[\d,]+ EUR: positions, then volatilities, then correlations/);
  });
});

describe("against the previous version", () => {
  it("names what the new version changed", async () => {
    const { submitFiling, signFiling, newFilingVersion, updateFiling } = await data();
    const { periodFiling } = await data();
    const current = (await periodFiling(w.officer, w.periodId)).current!;
    await submitFiling(w.officer, current.id);
    await signFiling(w.head, current.id, attestation(w.head));
    const v2 = await newFilingVersion(w.officer, current.id, { reason: "Explain the November exception." });
    const date = v2.exceptions.at(-1)!.date;
    const edited = await updateFiling(w.officer, v2.id, { coverNote: "November, second version.", explanations: { [date]: "A one-day gap in equity prices." } });
    expect(edited.content.filing.changesSinceLast.slice(0, 2)).toEqual(["The cover note differs from version 1.", `Exception explanations added or changed for ${date}.`]);
  });
});
