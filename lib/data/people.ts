import "server-only";
import { inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { users } from "@/db/schema";

/**
 * The names of the people a firm's records refer to (prepared by, approved by, signed by …), by user id. The ids come
 * from rows the caller already read under the firm; a user who has left keeps their row, so a missing name is rare
 * and each caller words its own fallback.
 */
export async function userNames(ids: (string | null | undefined)[]): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  if (wanted.length === 0) return new Map();
  const rows = await getDb().select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, wanted));
  return new Map(rows.map((r) => [r.id, r.name]));
}
