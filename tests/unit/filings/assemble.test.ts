/**
 * Assembling the draft filing: refused clearly without a marked, completed run (nothing stored); from the marked run
 * the content carries the run's own figures, its method statement version, its data-quality report, the firm's
 * profile and the caution; editing is limited to the cover note and explanations of real exceptions; another firm's
 * period and filing are not found.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { actorFor, snapshot } from "../helpers/db";
import { completedRun, filingWorld, NORTHMOOR, PELLAM, type FilingWorld } from "./setup";
import { auditEvents, filings } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { DRAFT_CAUTION } from "@/app/_components/draft-caution";
import { contentHash, type FilingViewModel } from "@/reports/view-model";
import type { RunRecord } from "@/lib/runs/types";

let w: FilingWorld;
const data = () => import("@/lib/data/filings");

async function refusal(promise: Promise<unknown>): Promise<AppError> {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error, "the call should have been refused").toBeInstanceOf(AppError);
  return error as AppError;
}

/** The figures without the officer's explanations (which an edit may change). */
function withoutExplanations(vm: FilingViewModel) {
  return { ...vm.figures, backtest: { ...vm.figures.backtest, exceptionList: vm.figures.backtest.exceptionList.map((e) => ({ ...e, explanation: "" })) } };
}

beforeAll(async () => {
  w = await filingWorld({ run: false });
});

describe("without a marked, completed run", () => {
  it("refuses to assemble when the period has no run at all, naming what is missing, and stores nothing", async () => {
    const { prepareFiling } = await data();
    const before = await snapshot(w.db);
    const error = await refusal(prepareFiling(w.officer, w.periodId));
    expect(error.code).toBe("conflict:filing_run");
    expect(error.message).toContain("has no run marked for its filing");
    expect(error.message).toContain("use for the filing");
    expect(await snapshot(w.db)).toEqual(before);
  });

  it("refuses while a completed run exists but is not marked for the filing", async () => {
    const { prepareFiling } = await data();
    await completedRun(w.analyst, w.periodId, false);
    const before = await snapshot(w.db);
    const error = await refusal(prepareFiling(w.officer, w.periodId));
    expect(error.message).toContain("has no run marked for its filing");
    expect(await snapshot(w.db)).toEqual(before);
  });

  it("refuses a marked run that has not completed (the runs table's own triggers are lifted to plant one)", async () => {
    const { prepareFiling } = await data();
    // A run can only be marked once completed (0005_runs_immutable.sql); the filing layer checks again on its own.
    await w.db.$client.execute("DROP TRIGGER runs_filing_run_insert");
    await w.db.$client.execute({
      sql: `INSERT INTO runs (id, firm_id, period_id, method_statement_id, positions_upload_id, status, stage, progress, is_filing_run, started_by, created_at)
            VALUES ('queued-run', ?1, ?2, (SELECT id FROM method_statements WHERE firm_id = ?1 LIMIT 1), (SELECT id FROM uploads WHERE firm_id = ?1 AND kind = 'positions' LIMIT 1), 'failed', 'failed', 0, 1, ?3, '2026-12-01T09:00:00.000Z')`,
      args: [w.officer.firmId, w.periodId, w.analyst.userId],
    });
    const before = await snapshot(w.db);
    const error = await refusal(prepareFiling(w.officer, w.periodId));
    expect(error.code).toBe("conflict:filing_run");
    expect(error.message).toContain("has not completed (it is failed)");
    expect(await snapshot(w.db)).toEqual(before);
  });
});

describe("from the marked run", () => {
  let run: RunRecord;
  let vm: FilingViewModel;
  let filingId: string;

  beforeAll(async () => {
    const runs = await import("@/lib/data/runs");
    const completed = (await runs.listRuns(w.analyst, w.periodId)).find((r) => r.status === "completed")!;
    // the planted failed run still holds the mark: move it (the failed run's trigger refuses changing it, so lift it too)
    await w.db.$client.execute("DROP TRIGGER runs_finished_no_update");
    await w.db.$client.execute("UPDATE runs SET is_filing_run = 0 WHERE id = 'queued-run'");
    await runs.useForFiling(w.analyst, completed.id);
    run = await runs.getRun(w.analyst, completed.id);
    const { prepareFiling } = await data();
    const filing = await prepareFiling(w.officer, w.periodId, { coverNote: "November: the book grew by one bond fund." });
    filingId = filing.id;
    vm = filing.content;
  });

  it("stores version 1 as a draft prepared by the officer, from that run", async () => {
    const { getFiling } = await data();
    const f = await getFiling(w.officer, filingId);
    expect(f).toMatchObject({ version: 1, status: "draft", runId: run.id, runIsMarked: true, previousId: null, preparedBy: { name: "Tomas Reyne" }, submittedBy: null, coverNote: "November: the book grew by one bond fund." });
  });

  it("carries the run's own figures exactly (capital, every capital term, VaR and ES, stressed VaR and its window, backtest)", () => {
    const m = run.results!.monthEnd;
    expect(vm.figures.capital.capital).toBe(m.capital.capital);
    expect(vm.figures.capital.varLast).toBe(m.capital.varLast);
    expect(vm.figures.capital.varAverage).toBe(m.capital.varAverage);
    expect(vm.figures.capital.multiplier).toBe(m.capital.multiplier);
    expect(vm.figures.capital.plusFactor).toBe(m.capital.plusFactor);
    const primary = m.methods.find((x) => x.method === m.primaryMethod)!;
    const total = vm.figures.totals.find((t) => t.primary)!;
    primary.byConfidence.forEach((c, i) => {
      expect(total.byConfidence[i].oneDay).toEqual({ var: c.oneDay.var, es: c.oneDay.es });
      expect(total.byConfidence[i].horizon).toEqual({ var: c.horizon.var, es: c.horizon.es });
      expect(vm.figures.byAssetClass[i].rows.map((r) => r.assetClass).sort()).toEqual(Object.keys(c.byAssetClass).sort());
    });
    expect(vm.figures.stressed.window).toEqual(m.stressed.window);
    expect(vm.figures.backtest.exceptions).toBe(m.backtest.exceptions);
    expect(vm.figures.backtest.exceptionList.map((e) => e.date)).toEqual(m.backtest.exceptionList.map((e) => e.date));
  });

  it("names the method statement version, the data-quality report, the firm's profile, the run and the caution", () => {
    const r = run.results!;
    expect(vm.method.version).toBe(r.method.version);
    expect(vm.method.rationale.length).toBeGreaterThan(20);
    expect(vm.dataQuality.counts).toEqual(r.dataQuality.report.counts);
    expect(vm.firm).toEqual({ name: "Northmoor Brokerage Ltd", reportingCurrency: "EUR", regulator: "Financial Markets Authority (demo)", licenceLabel: "Registration no." });
    expect(vm.period.end).toBe("2026-11-30");
    expect(vm.engine.runId).toBe(run.id);
    expect(vm.engine.startedBy).toBe("Priya Castell");
    expect(vm.caution).toBe(DRAFT_CAUTION);
    expect(vm.filing.changesSinceLast).toEqual(["This is the firm's first reporting period in Ballast: there is no earlier filing to compare with."]);
    expect(vm.signOff).toBeNull();
  });

  it("carries the run's backtest day by day, its factor volatilities and notes, and the correlation behind the figures", () => {
    const r = run.results!;
    expect(vm.figures.backtest.pnlVsVar.map((p) => p.date)).toEqual(r.backtestSeries.dates);
    expect(vm.figures.backtest.pnlVsVar.map((p) => p.pnl)).toEqual(r.backtestSeries.pnl);
    expect(vm.figures.riskFactors.map((f) => f.factor)).toEqual(r.monthEnd.factors.used);
    expect(vm.engine.notes).toEqual(r.notes);
    expect(vm.figures.correlation?.factors.length).toBe(vm.figures.correlation?.matrix.length);
    expect(vm.figures.correlation?.matrix.every((row, i) => row[i] === 1)).toBe(true);
  });

  it("records the assembly in the audit trail with the content hash", async () => {
    const [event] = await w.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.action, "filing.prepare"), eq(auditEvents.entityId, filingId)));
    expect(event.actorName).toBe("Tomas Reyne");
    expect((event.detail as { contentHash: string }).contentHash).toBe(contentHash(vm));
  });

  it("refuses a second draft for the same period while the first is in review", async () => {
    const { submitFiling, prepareFiling } = await data();
    await submitFiling(w.officer, filingId);
    const before = await snapshot(w.db);
    const error = await refusal(prepareFiling(w.officer, w.periodId));
    expect(error.message).toContain("is in review");
    expect(await snapshot(w.db)).toEqual(before);
  });

  it("keeps explanations to real exceptions, naming the date that is not one", async () => {
    const { requestChanges, updateFiling, getFiling } = await data();
    await requestChanges(w.head, filingId, { section: "backtest", reason: "Explain each exception." });
    const before = await snapshot(w.db);
    const error = await refusal(updateFiling(w.officer, filingId, { explanations: { "2026-11-29": "A Sunday." } }));
    expect(error.code).toBe("unprocessable:filing_explanations");
    expect(error.fields).toEqual({ "explanations.2026-11-29": "2026-11-29 is not a backtest exception of this filing's run." });
    expect(await snapshot(w.db)).toEqual(before);

    const [first] = vm.figures.backtest.exceptionList;
    const updated = await updateFiling(w.officer, filingId, { explanations: { [first.date]: "=SUM(A1) Rates moved after the announcement." }, coverNote: "Revised note." });
    expect(updated.exceptions.find((e) => e.date === first.date)?.explanation).toBe("=SUM(A1) Rates moved after the announcement.");
    expect(updated.content.filing.exceptionExplanations).toEqual([{ date: first.date, text: "=SUM(A1) Rates moved after the announcement." }]);
    expect(updated.content.filing.coverNote).toBe("Revised note.");
    // the figures are untouched by an edit
    expect(withoutExplanations(updated.content)).toEqual(withoutExplanations(vm));
    // removing an explanation
    const cleared = await updateFiling(w.officer, filingId, { explanations: { [first.date]: "" } });
    expect(cleared.content.filing.exceptionExplanations).toEqual([]);
    expect((await getFiling(w.officer, filingId)).coverNote).toBe("Revised note.");
  });

  it("answers another firm's period and filing as not found, for reads and writes alike", async () => {
    const { getFiling, periodFiling, prepareFiling, updateFiling, submitFiling, verifyFiling, downloadPack, listFilingVersions } = await data();
    const pellamHead = await actorFor(PELLAM.head);
    const pellamOfficer = await actorFor("june.okafor@pellam.example");
    const before = await snapshot(w.db);
    for (const call of [
      getFiling(pellamHead, filingId),
      periodFiling(pellamHead, w.periodId),
      listFilingVersions(pellamHead, w.periodId),
      verifyFiling(pellamHead, filingId),
      downloadPack(pellamHead, filingId, "docx"),
      prepareFiling(pellamOfficer, w.periodId),
      updateFiling(pellamOfficer, filingId, { coverNote: "x" }),
      submitFiling(pellamOfficer, filingId),
    ]) {
      const error = await refusal(call);
      expect(error.kind).toBe("not_found");
    }
    expect(await snapshot(w.db)).toEqual(before);
    // Northmoor's filing row is untouched and still Northmoor's
    const rows = await w.db.select({ firmId: filings.firmId }).from(filings);
    expect(rows.every((r) => r.firmId === w.officer.firmId)).toBe(true);
  });

  it("is read by the auditor too (any member)", async () => {
    const { getFiling } = await data();
    const auditor = await actorFor(NORTHMOOR.auditor);
    expect((await getFiling(auditor, filingId)).id).toBe(filingId);
  });
});
