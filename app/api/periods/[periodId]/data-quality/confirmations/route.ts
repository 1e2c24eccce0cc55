import { route } from "@/lib/auth/route";
import { getDataQuality } from "@/lib/data/data-quality";
import { confirmQualityItem } from "@/lib/data/quality-confirmations";
import { idParam } from "@/lib/validation/firm";
import { qualityConfirmSchema } from "@/lib/validation/quality";

/** Confirm a finding of the period's data-quality report that asks for it (risk analyst, compliance officer): why it is real. */
export const POST = route({ permission: "quality.confirm", params: idParam("periodId"), body: qualityConfirmSchema }, async ({ actor, params, body }) => {
  const periodId = params.periodId;
  const { report } = await getDataQuality(actor, periodId);
  return Response.json({ confirmation: await confirmQualityItem(actor, periodId, body, report.items) }, { status: 201 });
});
