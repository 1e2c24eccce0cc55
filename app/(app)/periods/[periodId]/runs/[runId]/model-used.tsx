/**
 * The model the run used, from the resolved configuration it stored (never from the method statement's intent):
 * the sentences the packs print, and each factor's process, parameters, start-up and one-day volatility.
 */
import type { RunResults } from "@/lib/runs/types";
import { ASSET_CLASS_LABELS, type AssetClass } from "@/lib/uploads/asset-classes";
import { describeComputedMethod } from "@/reports/method-text";
import { FigureTable } from "@/app/_components/figure-table";
import { pct } from "../_components/run-format";
import { Bullets } from "../_components/bullets";

const SOURCE_WORDS: Record<string, string> = { factor: "the factor's own choice", "asset-class": "its asset class", default: "the firm-wide default", legacy: "the one covariance model" };

function params(p: Record<string, number>): string {
  return Object.entries(p)
    .filter(([, v]) => Number.isFinite(v))
    .map(([k, v]) => `${k} ${Number(v.toPrecision(4))}`)
    .join(", ");
}

export function ModelUsed({ results }: { results: RunResults }) {
  const model = results.monthEnd.model;
  const sentences = describeComputedMethod(results.monthEnd, results.method.content);
  return (
    <div className="flex flex-col gap-3">
      <Bullets items={sentences} className="list-disc space-y-1 pl-5 text-sm" testId="model-statements" />
      {model ? (
        <div className="relative overflow-x-auto">
          <FigureTable
            testId="model-factors"
            caption="The volatility model of each factor, as fitted for this run's figures"
            hiddenCaption
            words
            gap="pr-3"
            bodyClassName=""
            columns={["Factor", "Chosen by", "Model used", "Parameters", "Start-up", { label: "1-day volatility", align: "right" }]}
          >
            {model.factors.map((f) => (
              <tr key={f.factor} className="border-b border-ink-line/60 align-top">
                <th scope="row" className="py-1.5 pr-3 text-left font-medium">{f.factor}</th>
                <td className="py-1.5 pr-3">
                  {SOURCE_WORDS[f.source] ?? f.source}
                  {f.assetClass ? ` (${ASSET_CLASS_LABELS[f.assetClass as AssetClass] ?? f.assetClass})` : ""}
                </td>
                <td className="py-1.5 pr-3">
                  {f.label}
                  {f.fallback ? <span className="block text-xs text-caution">Fallback: {f.fallback.label} could not be used ({f.fallback.reason}).</span> : null}
                </td>
                <td className="figure py-1.5 pr-3 text-xs">{params(f.params) || "—"}</td>
                <td className="py-1.5 pr-3 text-xs text-ink-soft">{f.startUp}</td>
                <td className="figure py-1.5 text-right">{pct(Math.sqrt(f.variance))}</td>
              </tr>
            ))}
          </FigureTable>
        </div>
      ) : (
        <p className="text-xs text-ink-muted">This run was stored before runs kept their resolved model; the sentences above read its method statement as it computed.</p>
      )}
    </div>
  );
}
