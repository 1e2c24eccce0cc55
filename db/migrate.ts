/** Apply the committed migrations in db/migrations to the configured database (`npm run db:migrate`). */
import { migrate } from "drizzle-orm/libsql/migrator";
import path from "node:path";
import { openDatabase, databaseUrl } from "./client";

/** Migrate the database at `url` to the latest schema. */
export async function migrateDatabase(url = databaseUrl()): Promise<void> {
  const db = openDatabase(url);
  await db.$client.execute("PRAGMA journal_mode = WAL");
  await migrate(db, { migrationsFolder: path.join(__dirname, "migrations") });
  db.$client.close();
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(__filename)) {
  migrateDatabase()
    .then(() => console.log(`migrated ${databaseUrl()}`))
    .catch((error) => {
      console.error(`migration failed: ${error instanceof Error ? error.message : error}`);
      process.exit(1);
    });
}
