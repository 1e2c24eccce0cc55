import { describe, expect, it } from "vitest";
import { actorFor } from "../helpers/db";
import { reminderWorld } from "../helpers/reminder-world";
import { DEMO_USERS, SECOND_FIRM_USERS } from "@/db/seed";
import type { Mailer } from "@/lib/mail/transport";
import { runReminders } from "@/lib/data/reminders";
import { listReminderLog } from "@/lib/data/reminder-log";
import { closedPort, delayRecorder, logRows, mailerFor, RUN } from "./helpers";

const world = reminderWorld();
const [, tomas, , , , nia] = DEMO_USERS;
const june = SECOND_FIRM_USERS[1];
const everyone = [june.email, nia.email, tomas.email].sort();

describe("when mail fails", () => {
  it("an unreachable mail server: a clear status for the admin, no crash, and the reminders go out once it is back", async () => {
    const port = await closedPort();
    const down = mailerFor(port);
    const { delay, waits } = delayRecorder();
    const result = await runReminders({ ...RUN, mailer: down, delay });
    down.close();
    expect(result).toMatchObject({ mail: "ok", recorded: 3, sent: 0, failed: 1 });
    expect(result.problems).toEqual([
      `Could not reach the mail server at 127.0.0.1:${port} (connection refused).`,
      "Stopped this run: the mail server cannot be reached. The remaining reminders wait for the next run.",
    ]);
    expect(waits).toEqual([1000, 2000]); // three tries, backing off
    const rows = await logRows();
    const failed = rows.find((r) => r.status === "retry")!;
    expect(failed).toMatchObject({ attempts: 3, lastError: `Could not reach the mail server at 127.0.0.1:${port} (connection refused).`, nextAttemptAt: "2026-12-14T06:15:00.000Z" });
    expect(rows.filter((r) => r.status === "pending")).toHaveLength(2);

    // The admin sees it.
    const admin = await actorFor(DEMO_USERS[0].email);
    const shown = await listReminderLog(admin);
    expect(shown.find((r) => r.status === "retry")?.lastError).toContain("Could not reach the mail server");

    // Back up: the waiting ones go at once; the failed one after its retry time; nobody gets two.
    const up = mailerFor(world.listener);
    expect(await runReminders({ ...RUN, mailer: up })).toMatchObject({ sent: 2, failed: 0 });
    expect(await runReminders({ ...RUN, mailer: up, now: new Date("2026-12-14T06:16:00Z") })).toMatchObject({ sent: 1, failed: 0 });
    expect(await runReminders({ ...RUN, mailer: up, now: new Date("2026-12-14T09:00:00Z") })).toMatchObject({ sent: 0 });
    up.close();
    expect(world.listener.messages.flatMap((m) => m.to).sort()).toEqual(everyone);
    expect((await logRows()).every((r) => r.status === "sent")).toBe(true);
  });

  it("gives up after repeated failures, says why, and records it in the audit trail", async () => {
    const port = await closedPort();
    const down = mailerFor(port);
    const { delay } = delayRecorder();
    let now = RUN.now.getTime();
    for (let run = 0; run < 3; run++) {
      await runReminders({ ...RUN, mailer: down, delay, now: new Date(now) });
      now += 24 * 3600_000;
    }
    down.close();
    const failed = (await logRows()).find((r) => r.status === "failed")!;
    expect(failed.attempts).toBe(9);
    expect(failed.nextAttemptAt).toBeNull();
    const admin = await actorFor(DEMO_USERS[0].email);
    expect((await listReminderLog(admin)).some((r) => r.status === "failed")).toBe(true);
  });

  it("a crash in the middle of a batch sends no duplicates on restart", async () => {
    const real = mailerFor(world.listener);
    let calls = 0;
    let crashed!: () => void;
    const crash = new Promise<void>((resolve) => (crashed = resolve));
    // The second e-mail is delivered, then the process "dies" before it can record "sent": the run never resumes.
    const dying: Mailer = {
      describe: real.describe,
      close: () => undefined,
      async send(message) {
        calls++;
        const info = await real.send(message);
        if (calls === 2) {
          crashed();
          return new Promise<never>(() => undefined);
        }
        return info;
      },
    };
    void runReminders({ ...RUN, mailer: dying });
    await crash;
    expect(world.listener.messages).toHaveLength(2);

    // Restart: the unconfirmed one stays unconfirmed (shown to the admin), the rest are sent, nobody twice.
    const restart = await runReminders({ ...RUN, mailer: real });
    real.close();
    expect(restart).toMatchObject({ sent: 1 });
    expect(world.listener.messages.flatMap((m) => m.to).sort()).toEqual(everyone);
    const rows = await logRows();
    expect(rows.map((r) => r.status).sort()).toEqual(["sending", "sent", "sent"]);
    const admin = await actorFor(DEMO_USERS[0].email);
    expect((await listReminderLog(admin)).filter((r) => r.status === "sending")).toHaveLength(1);
    expect(await runReminders({ ...RUN, mailer: mailerFor(world.listener) })).toMatchObject({ sent: 0 });
    expect(world.listener.messages).toHaveLength(3);
  });
});
