import { route } from "@/lib/auth/route";
import { getRun } from "@/lib/data/runs";
import { AppError } from "@/lib/errors";
import { idParam } from "@/lib/validation/firm";

/** Every factor of a completed run: volatility under each estimator, the chosen one, parameters, warnings. */
export const GET = route({ permission: "periods.read", params: idParam("runId") }, async ({ actor, params }) => {
  const run = await getRun(actor, params.runId, { detail: false });
  if (!run.results) throw new AppError("conflict:run", run.status === "failed" ? "The run failed; it has no figures." : "The run has not finished yet.");
  return { ...run.results.factorVolatility, excludedFactors: run.results.inputs.excludedFactors, engineVolatility: run.results.monthEnd.volatilityModels };
});
