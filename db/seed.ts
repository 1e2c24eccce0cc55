/**
 * The demo: an invented broker (Northmoor Brokerage) with one person per role and one holding two roles, and a
 * smaller invented firm (Pellam Capital) so that tenant isolation can be seen. `npm run db:seed` resets and
 * fills the configured database. Names, firms and addresses are invented (.example is a reserved domain).
 */
import path from "node:path";
import { rmSync } from "node:fs";
import { format, subMonths, endOfMonth, startOfMonth } from "date-fns";
import bcrypt from "bcryptjs";
import { openDatabase, databaseUrl, type Database } from "./client";
import { migrateDatabase } from "./migrate";
import * as s from "./schema";
import { deadlineFor } from "../lib/calendar/deadline";
import { now, setStampClock } from "../lib/clock";
import { BASEL_PLUS_FACTORS } from "../lib/accounts/firm-defaults";

import { DEMO_PASSWORD, DEMO_USERS, SECOND_FIRM_USERS } from "./demo-people";

export { DEMO_PASSWORD, DEMO_USERS, SECOND_FIRM_USERS };

/** Plus factors by exception count over 250 days (Basel Committee 1996 backtesting framework, Table 2). */
export { BASEL_PLUS_FACTORS };

/** Holidays of the demo firm's calendar (invented for the demo; a firm uploads its own). */
const DEMO_HOLIDAYS = [
  ["2026-12-24", "Christmas Eve"], ["2026-12-25", "Christmas Day"], ["2026-12-26", "Second Christmas Day"],
  ["2026-12-31", "New Year's Eve"], ["2027-01-01", "New Year's Day"],
] as const;

async function seedFirm(
  db: Database,
  firm: { name: string; slug: string; currency: string; regulator: string },
  people: readonly { email: string; name: string; roles: readonly string[] }[],
  passwordHash: string,
  today: Date,
  holidayList: readonly (readonly [string, string])[],
) {
  const [row] = await db
    .insert(s.firms)
    .values({ name: firm.name, slug: firm.slug, reportingCurrency: firm.currency, regulatorName: firm.regulator, licenceLabel: "Registration no.", methodCoApproval: true })
    .returning();
  await db.insert(s.calendarSettings).values({ firmId: row.id, deadlineRule: "business-days-after", deadlineValue: 15 });
  if (holidayList.length) await db.insert(s.holidays).values(holidayList.map(([date, name]) => ({ firmId: row.id, date, name })));
  await db.insert(s.capitalRuleProfiles).values({ firmId: row.id, plusFactors: BASEL_PLUS_FACTORS });
  // The demo's history has times of its own in the past: the firm was set up three months before the open
  // period's month, and that period opened on the first of its month (see seedDemo's stamp clock).
  const at = now().toISOString();
  for (const person of people) {
    const [user] = await db.insert(s.users).values({ email: person.email, name: person.name, passwordHash }).returning();
    const [membership] = await db.insert(s.memberships).values({ firmId: row.id, userId: user.id, roles: [...person.roles] }).returning();
    await db.insert(s.auditEvents).values({
      firmId: row.id,
      actorId: null,
      actorName: "Demo set-up",
      at,
      action: "member.add",
      entityType: "membership",
      entityId: membership.id,
      summary: `Added ${person.name} <${person.email}> as ${person.roles.join(", ")}`,
    });
  }
  const periodEnd = format(endOfMonth(subMonths(today, 1)), "yyyy-MM-dd");
  const deadline = deadlineFor(periodEnd, { kind: "business-days-after", days: 15 }, new Set(holidayList.map(([d]) => d)));
  const openedAt = `${periodEnd.slice(0, 8)}01T06:00:00.000Z`;
  const [period] = await db.insert(s.reportingPeriods).values({ firmId: row.id, periodEnd, deadline, createdAt: openedAt }).returning();
  await db.insert(s.auditEvents).values({
    firmId: row.id,
    actorId: null,
    actorName: "Demo set-up",
    at: openedAt,
    action: "period.open",
    entityType: "reporting_period",
    entityId: period.id,
    summary: `Opened the period ending ${periodEnd} (deadline ${deadline})`,
  });
  return row;
}

/** Fill an empty, migrated database with the demo firms. `today` fixes the demo's month end. */
export async function seedDemo(db: Database, today = new Date()): Promise<void> {
  const existing = await db.select({ id: s.firms.id }).from(s.firms).limit(1);
  if (existing.length) throw new Error("the database already holds firms; the demo seeds only an empty database");
  const passwordHash = await bcrypt.hash(DEMO_PASSWORD, 11);
  // The firms and their people were set up at 08:00 UTC on the first of the month three months before today's.
  setStampClock(`${format(startOfMonth(subMonths(today, 3)), "yyyy-MM-dd")}T08:00:00.000Z`);
  try {
    await seedFirm(db, { name: "Northmoor Brokerage Ltd", slug: "northmoor", currency: "EUR", regulator: "Financial Markets Authority (demo)" }, DEMO_USERS, passwordHash, today, DEMO_HOLIDAYS);
    await seedFirm(db, { name: "Pellam Capital Partners", slug: "pellam", currency: "GBP", regulator: "Conduct Authority (demo)" }, SECOND_FIRM_USERS, passwordHash, today, []);
  } finally {
    setStampClock(null);
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  (async () => {
    const url = databaseUrl();
    if (url.startsWith("file:")) {
      // The demo starts from a fresh file: remove the old one with its WAL side files.
      const file = path.resolve(url.slice("file:".length));
      for (const suffix of ["", "-wal", "-shm"]) rmSync(file + suffix, { force: true });
    }
    await migrateDatabase();
    const db = openDatabase();
    const { seedDemoUploads, resetLocalFileStore } = await import("./seed-uploads");
    resetLocalFileStore();
    const pinned = process.env.BALLAST_CLOCK;
    const today = pinned ? new Date(pinned.length === 10 ? `${pinned}T09:00:00Z` : pinned) : new Date();
    await seedDemo(db, today);
    await seedDemoUploads(db, format(endOfMonth(subMonths(today, 1)), "yyyy-MM-dd"));
    // The demo's method statement was approved in mid-September, before the October cycle it served.
    const pinnedToday = process.env.BALLAST_CLOCK;
    process.env.BALLAST_CLOCK = "2026-09-15";
    try {
      await (await import("./seed-method")).seedDemoMethod(db);
    } finally {
      if (pinnedToday === undefined) delete process.env.BALLAST_CLOCK;
      else process.env.BALLAST_CLOCK = pinnedToday;
    }
    await (await import("./seed-history")).seedDemoHistory(db);
    // After the October filing, the compliance officer set the profile to file the standardised figure (version 2).
    await (await import("./seed-capital")).seedDemoCapitalProfile(db);
    setStampClock(null);
    db.$client.close();
    console.log(`seeded the demo firms into ${databaseUrl()}`);
  })().catch((error) => {
    console.error(`seed failed: ${error instanceof Error ? error.message : error}`);
    process.exit(1);
  });
}
