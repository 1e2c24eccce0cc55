/**
 * The reminder scheduler's test world, for a test file that sends reminders: registers the file's hooks (before all
 * tests a private copy of the seeded world and a local SMTP listener on a free port, closed after them; before each
 * test an empty reminder log and no mail received) and gives the database and the listener once they are set up.
 */
import { afterAll, beforeAll, beforeEach } from "vitest";
import { freshDatabase } from "./db";
import type { Database } from "@/db/client";
import { reminderLog } from "@/db/schema";
import { startMailListener, type MailListener } from "@/lib/mail/listener";

export interface ReminderWorld {
  readonly db: Database;
  readonly listener: MailListener;
}

export function reminderWorld(): ReminderWorld {
  let db: Database | undefined;
  let listener: MailListener | undefined;
  const world: ReminderWorld = {
    get db() {
      if (!db) throw new Error("the reminder world is read before its beforeAll has run");
      return db;
    },
    get listener() {
      if (!listener) throw new Error("the reminder world is read before its beforeAll has run");
      return listener;
    },
  };
  beforeAll(async () => {
    db = await freshDatabase();
    listener = await startMailListener({ smtpPort: 0 });
  });
  afterAll(async () => {
    await world.listener.close();
  });
  beforeEach(async () => {
    await world.db.delete(reminderLog);
    world.listener.messages.length = 0;
  });
  return world;
}
