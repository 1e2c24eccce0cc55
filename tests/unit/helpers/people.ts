/**
 * The seeded people a unit test acts as, and one call that opens this file's private copy of a world on the pinned
 * clock and resolves their actors the way the gate would: what each file's beforeAll used to spell out line by line
 * (the clock, the database, one actorFor per person).
 */
import type { Database } from "@/db/client";
import type { Actor } from "@/lib/auth/actor";
import { actorFor, worldDatabase } from "./db";
import type { World } from "./template-worlds";

/** Seeded people by firm and part (db/demo-people.ts). */
export const SEEDED = {
  northmoorAdmin: "ada.quayle@northmoor.example",
  northmoorOfficer: "tomas.reyne@northmoor.example",
  northmoorAnalyst: "priya.castell@northmoor.example",
  pellamAdmin: "rafe.pellam@pellam.example",
  pellamOfficer: "june.okafor@pellam.example",
} as const;

/** The database handle and one actor per named person. */
export type WorldAs<K extends string> = { db: Database } & Record<K, Actor>;

/** The actors of the named people, resolved in the order given. */
export async function actorsFor<K extends string>(people: Record<K, string>): Promise<Record<K, Actor>> {
  const actors = {} as Record<K, Actor>;
  for (const [name, email] of Object.entries(people) as [K, string][]) actors[name] = await actorFor(email);
  return actors;
}

/**
 * A private copy of a template world (default: the seeded demo firms) with the business clock pinned (default
 * 2026-12-01, the day the demo is seeded at), and the actors of `people`: `{ db, officer, … }`.
 */
export async function worldAs<K extends string>(people: Record<K, string>, options: { world?: World; clock?: string } = {}): Promise<WorldAs<K>> {
  const db = await worldDatabase(options.world ?? "seeded", { clock: options.clock ?? "2026-12-01" });
  return { db, ...(await actorsFor(people)) };
}
