/** Column helpers shared by every table: generated ids, timestamps, and the firm scope of tenant tables. */
import { text } from "drizzle-orm/sqlite-core";
import { now } from "../lib/clock";

/** A random, opaque primary key. */
export const id = () =>
  text("id")
    .primaryKey()
    .$defaultFn(() => crypto.randomUUID());

/** ISO-8601 UTC timestamp text, set on insert. */
export const createdAt = () =>
  text("created_at")
    .notNull()
    .$defaultFn(() => now().toISOString());

/** Every tenant table spreads these: the firm that owns the row. */
export const firmColumns = {
  firmId: text("firm_id").notNull(),
};
