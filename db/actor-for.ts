/**
 * The actor of a person's (first) membership, built as the gate builds it, for scripts that act without a request:
 * the demo seed, tests, benchmarks. Never used to serve a request — those go through lib/auth/actor.ts.
 */
import { eq } from "drizzle-orm";
import type { Database } from "./client";
import { firms, memberships, users } from "./schema";
import { parseRoles } from "../lib/auth/roles";
import type { Actor } from "../lib/auth/actor";

/** The actor for a person by e-mail; throws when there is no such person. */
export async function actorForEmail(db: Database, email: string): Promise<Actor> {
  const [row] = await db
    .select({ user: users, membership: memberships, firm: firms })
    .from(users)
    .innerJoin(memberships, eq(memberships.userId, users.id))
    .innerJoin(firms, eq(firms.id, memberships.firmId))
    .where(eq(users.email, email));
  if (!row) throw new Error(`no person ${email}`);
  return {
    userId: row.user.id,
    name: row.user.name,
    email: row.user.email,
    firmId: row.firm.id,
    firmName: row.firm.name,
    reportingCurrency: row.firm.reportingCurrency,
    roles: parseRoles(row.membership.roles),
    firms: [{ id: row.firm.id, name: row.firm.name }],
  };
}
