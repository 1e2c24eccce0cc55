/**
 * The one gate: who is asking, and for which firm. Session → user (active, current session version) →
 * active membership → firm and roles, read from the database on every request.
 */
import "server-only";
import { cache } from "react";
import { cookies } from "next/headers";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { firms, memberships, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { auth } from "./index";
import { can, type Permission } from "./permissions";
import { parseRoles, type Role } from "./roles";

/** The signed-in person acting for one firm. Every data function takes one. */
export interface Actor {
  userId: string;
  name: string;
  email: string;
  firmId: string;
  firmName: string;
  reportingCurrency: string;
  roles: readonly Role[];
  /** every firm this person belongs to, for the firm switcher */
  firms: { id: string; name: string }[];
}

/** The cookie that remembers which of their firms a person is working for. */
export const FIRM_COOKIE = "ballast_firm";

/** Resolve the actor of this request, or null when nobody (valid) is signed in. Cached per request. */
export const getActor = cache(async (): Promise<Actor | null> => {
  const session = await auth();
  const userId = session?.user?.id;
  if (!userId) return null;
  const db = getDb();
  const [user] = await db.select().from(users).where(eq(users.id, userId));
  if (!user || !user.active) return null;
  const sessionVersion = (session as { sv?: number }).sv ?? 1;
  if (sessionVersion !== user.sessionVersion) return null;
  const rows = await db
    .select({ membership: memberships, firm: firms })
    .from(memberships)
    .innerJoin(firms, eq(firms.id, memberships.firmId))
    .where(and(eq(memberships.userId, userId), eq(memberships.active, true)));
  if (rows.length === 0) return null;
  const wanted = (await cookies()).get(FIRM_COOKIE)?.value;
  const chosen = rows.find((r) => r.firm.id === wanted) ?? rows[0];
  return {
    userId: user.id,
    name: user.name,
    email: user.email,
    firmId: chosen.firm.id,
    firmName: chosen.firm.name,
    reportingCurrency: chosen.firm.reportingCurrency,
    roles: parseRoles(chosen.membership.roles),
    firms: rows.map((r) => ({ id: r.firm.id, name: r.firm.name })),
  };
});

/** The actor, or an AppError: 401 when nobody is signed in, 403 when the roles do not grant `permission`. */
export async function requireActor(permission?: Permission): Promise<Actor> {
  const actor = await getActor();
  if (!actor) throw new AppError("unauthorized:auth");
  if (permission && !can(actor, permission)) throw new AppError("forbidden:auth");
  return actor;
}
