/** The data-quality report of a period, from its confirmed positions and the firm's price history. */
import "server-only";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { positions, uploads } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { dataQualityReport, type QualityReport } from "@/lib/uploads/data-quality";
import { getCalendar, getPeriod } from "./periods";
import { priceSeries } from "./prices";
import { periodConfirmations, withConfirmations } from "./quality-confirmations";
import { currentCapitalProfile } from "./capital-profile";
import { attributesFromStored, standardisedQualityItems } from "@/lib/uploads/position-attributes";

/** The period's confirmed positions upload, if any. */
export async function confirmedPositionsUpload(actor: Actor, periodId: string) {
  const [row] = await getDb()
    .select()
    .from(uploads)
    .where(and(eq(uploads.firmId, actor.firmId), eq(uploads.periodId, periodId), eq(uploads.kind, "positions"), eq(uploads.status, "confirmed")));
  return row ?? null;
}

/** The report for a period; an empty report (with a note) when no positions are confirmed yet. */
export async function getDataQuality(actor: Actor, periodId: string): Promise<{ periodEnd: string; uploadId: string | null; fileName: string | null; positions: number; report: QualityReport }> {
  const period = await getPeriod(actor, periodId);
  const upload = await confirmedPositionsUpload(actor, periodId);
  const rows = upload
    ? await getDb().select().from(positions).where(and(eq(positions.firmId, actor.firmId), eq(positions.uploadId, upload.id)))
    : [];
  const series = await priceSeries(actor.firmId, period.periodEnd);
  const { holidays } = await getCalendar(actor.firmId);
  // under a profile that files the standardised figure, each confirmed position lacking what its block needs
  const profile = await currentCapitalProfile(actor);
  const extraItems =
    profile?.filedRegime === "standardised"
      ? standardisedQualityItems(
          rows.map((r) => ({ row: r.rowNumber, instrumentId: r.instrumentCode, assetClass: r.assetClass, currency: r.currency, quantity: r.quantity, marketValue: r.marketValue, attributes: attributesFromStored(r) })),
          { reportingCurrency: actor.reportingCurrency, asOf: period.periodEnd, profile: profile.standardised },
        )
      : [];
  const report = dataQualityReport(
    rows.map((r) => ({ instrumentId: r.instrumentCode, currency: r.currency, quantity: r.quantity, price: r.price, marketValue: r.marketValue })),
    series,
    { reportingCurrency: actor.reportingCurrency, periodEnd: period.periodEnd, holidays, extraItems },
  );
  // findings that ask for confirmation carry it once someone confirmed them (who, when, why)
  report.items = withConfirmations(report.items, await periodConfirmations(actor, periodId));
  return { periodEnd: period.periodEnd, uploadId: upload?.id ?? null, fileName: upload?.fileName ?? null, positions: rows.length, report };
}
