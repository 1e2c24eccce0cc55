/** A method statement version in readable form: estimators, parameters, rationale, limitations, evidence. */
import { ASSET_CLASSES, ASSET_CLASS_LABELS } from "@/lib/uploads/asset-classes";
import { FigureRow, FigureTable } from "@/app/_components/figure-table";
import { formatTimestamp } from "@/app/_components/format";
import { COVARIANCE_LABELS, DISTRIBUTION_LABELS, PORTFOLIO_VOLATILITY_LABELS, SCALING_LABELS, VAR_METHOD_LABELS, describeCorrelation, describeEstimator, describeRefit, formatConfidence } from "@/lib/method/describe";
import type { MethodVersion } from "@/lib/data/method";
import { EvidenceView } from "./evidence-view";
import { VersionStatus } from "./version-status";

export function ApprovalLine({ version }: { version: MethodVersion }) {
  return (
    <p className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
      <VersionStatus status={version.status} awaitingCoApproval={version.awaitingCoApproval} />
      <span>
        Version {version.version} · drafted by {version.createdBy.name}
        {version.approvedBy ? ` · approved by ${version.approvedBy.name}` : ""}
        {version.coApprovedBy ? ` · co-approved by ${version.coApprovedBy.name}` : ""}
        {version.approvedAt ? ` on ${formatTimestamp(version.approvedAt)}` : ""}
      </span>
    </p>
  );
}

/** The method pages' tables of words: roomier cells than the figures', the row's name in medium weight. */
export const WORD_TABLE = { pad: "py-2", gap: "pr-4", bodyClassName: "" } as const;
export const WORD_ROW = { pad: "py-2", gap: "pr-4", className: "border-b border-ink-line/60", headClassName: "text-left font-medium" } as const;

export function EstimatorTable({ version }: { version: MethodVersion }) {
  const c = version.content;
  return (
    <FigureTable caption="Volatility estimator by asset class" hiddenCaption words {...WORD_TABLE} columns={["Asset class", "Volatility estimator"]}>
      <FigureRow {...WORD_ROW} head="Firm-wide default" cells={[describeEstimator(c.defaultEstimator)]} />
      {ASSET_CLASSES.filter((k) => c.byAssetClass[k]).map((k) => (
        <FigureRow key={k} {...WORD_ROW} head={ASSET_CLASS_LABELS[k]} cells={[describeEstimator(c.byAssetClass[k]!)]} />
      ))}
    </FigureTable>
  );
}

export function ParameterList({ version }: { version: MethodVersion }) {
  const c = version.content;
  const rows: [string, string][] = [
    ["Portfolio volatilities", PORTFOLIO_VOLATILITY_LABELS[c.portfolioVolatility]],
    c.portfolioVolatility === "asset-class"
      ? ["Correlation", describeCorrelation(c.correlation)]
      : ["Covariance", `${COVARIANCE_LABELS[c.covariance]} (λ ${c.covarianceLambda}, ${c.covarianceWindow}-day window); the estimators above give the factor volatility report only`],
    ["Backtest parameters", describeRefit(c.backtestRefit)],
    ["VaR method", VAR_METHOD_LABELS[c.varMethod]],
    ["Return distribution", DISTRIBUTION_LABELS[c.distribution]],
    ["Confidence levels", c.confidences.map(formatConfidence).join(", ")],
    ["Horizon and scaling", `${c.horizonDays} ${c.horizonDays === 1 ? "day" : "days"}; ${SCALING_LABELS[c.scaling].toLowerCase()}`],
    ["Historical window", `${c.historicalWindow} days`],
    ["Stress window", c.stressWindow.mode === "search" ? "Searched: the worst window in the stored history" : `Chosen: ${c.stressWindow.start} to ${c.stressWindow.end}`],
    ["Minimum history", `${c.minHistory} returns per factor; factors with fewer are left out and listed`],
  ];
  return (
    <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[12rem_1fr]">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="font-medium text-ink-soft">{k}</dt>
          <dd>{v}</dd>
        </div>
      ))}
    </dl>
  );
}

export function Limitations({ version }: { version: MethodVersion }) {
  return (
    <ul className="space-y-2 text-sm">
      {version.engineLimitations.map((t) => (
        <li key={t} className="flex gap-2">
          <span className="mt-0.5 shrink-0 rounded border border-ink-line bg-paper-sunk px-1.5 text-xs text-ink-soft">Engine</span>
          <span>{t}</span>
        </li>
      ))}
      {version.analystLimitations.map((t) => (
        <li key={t} className="flex gap-2">
          <span className="mt-0.5 shrink-0 rounded border border-brass/40 bg-brass-light px-1.5 text-xs text-brass-dark">Analyst</span>
          <span>{t}</span>
        </li>
      ))}
    </ul>
  );
}

export function Section({ id, title, children, actions }: { id: string; title: string; children: React.ReactNode; actions?: React.ReactNode }) {
  return (
    <section aria-labelledby={id} className="rounded-lg border border-ink-line bg-paper-raised p-5">
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 id={id} className="text-lg font-semibold">
          {title}
        </h2>
        {actions}
      </div>
      {children}
    </section>
  );
}

/** The whole version, read-only. */
export function MethodView({ version }: { version: MethodVersion }) {
  return (
    <div className="flex flex-col gap-6">
      {version.reason ? (
        <p className="text-sm">
          <span className="font-medium">Why this version{version.previousVersion ? ` changes version ${version.previousVersion}` : ""}: </span>
          {version.reason}
        </p>
      ) : null}
      <Section id="estimators" title="Volatility estimators">
        <EstimatorTable version={version} />
      </Section>
      <Section id="parameters" title="Covariance, VaR and windows">
        <ParameterList version={version} />
      </Section>
      <Section id="rationale" title="Rationale">
        <div className="max-w-3xl space-y-2 whitespace-pre-line text-sm leading-6">{version.rationale || <span className="text-ink-muted">No rationale written yet.</span>}</div>
      </Section>
      <Section id="limitations" title="Limitations">
        <p className="mb-3 text-sm text-ink-muted">The engine&apos;s limitations of each chosen estimator are part of every version and cannot be removed; the analyst&apos;s own follow.</p>
        <Limitations version={version} />
      </Section>
      <Section id="evidence" title="Evidence: estimators compared on the firm's history">
        <EvidenceView evidence={version.evidence} />
      </Section>
    </div>
  );
}
