/** The firm's stored price history: coverage per instrument, and the series as of a date for runs and checks. */
import "server-only";
import { and, eq, isNull, lte, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { instruments, pricePoints } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";

export interface InstrumentCoverage {
  code: string;
  name: string;
  assetClass: string;
  currency: string;
  points: number;
  first: string | null;
  last: string | null;
  corrections: number;
}

/** Per instrument: how many current prices, from when to when, and how many were corrected. */
export async function priceCoverage(actor: Actor): Promise<InstrumentCoverage[]> {
  const rows = await getDb()
    .select({
      code: instruments.code,
      name: instruments.name,
      assetClass: instruments.assetClass,
      currency: instruments.currency,
      points: sql<number>`sum(case when ${pricePoints.current} = 1 then 1 else 0 end)`,
      first: sql<string | null>`min(case when ${pricePoints.current} = 1 then ${pricePoints.date} end)`,
      last: sql<string | null>`max(case when ${pricePoints.current} = 1 then ${pricePoints.date} end)`,
      corrections: sql<number>`sum(case when ${pricePoints.current} = 0 and ${pricePoints.staged} = 0 then 1 else 0 end)`,
    })
    .from(instruments)
    .leftJoin(pricePoints, and(eq(pricePoints.instrumentId, instruments.id), eq(pricePoints.firmId, actor.firmId)))
    .where(and(eq(instruments.firmId, actor.firmId), isNull(instruments.pendingUpload)))
    .groupBy(instruments.id)
    .orderBy(instruments.code);
  return rows.map((r) => ({ ...r, points: Number(r.points ?? 0), corrections: Number(r.corrections ?? 0) }));
}

/** Every current closing price up to `asOf`, by instrument code, dates ascending. */
export async function priceSeries(firmId: string, asOf: string): Promise<Map<string, { dates: string[]; closes: number[] }>> {
  const rows = await getDb()
    .select({ code: instruments.code, date: pricePoints.date, close: pricePoints.close })
    .from(pricePoints)
    .innerJoin(instruments, eq(instruments.id, pricePoints.instrumentId))
    .where(and(eq(pricePoints.firmId, firmId), eq(pricePoints.current, true), lte(pricePoints.date, asOf)))
    .orderBy(instruments.code, pricePoints.date);
  const series = new Map<string, { dates: string[]; closes: number[] }>();
  for (const r of rows) {
    let s = series.get(r.code);
    if (!s) series.set(r.code, (s = { dates: [], closes: [] }));
    s.dates.push(r.date);
    s.closes.push(r.close);
  }
  return series;
}
