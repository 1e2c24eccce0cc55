import { route } from "@/lib/auth/route";
import { getRun, getRunInputs } from "@/lib/data/runs";
import { AppError } from "@/lib/errors";
import { idParam } from "@/lib/validation/firm";
import { volatilityQuerySchema } from "@/lib/validation/runs";
import { volatilityDetail } from "@/lib/runs/volatility-detail";

/** One factor's volatility over time under each estimator, computed on demand from the run's stored inputs. */
export const GET = route({ permission: "periods.read", params: idParam("runId"), query: volatilityQuerySchema }, async ({ actor, params, query }) => {
  await getRun(actor, params.runId, { detail: false });
  const inputs = await getRunInputs(actor, params.runId);
  const factors = Object.keys(inputs.prices.factors).sort();
  const factor = query.factor ?? factors[0];
  const detail = factor ? volatilityDetail(inputs, factor) : null;
  if (!detail) throw new AppError("not_found:factor", `The run has no factor "${factor}".`, { factor: "Not a factor of this run." });
  return detail;
});
