import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { actorFor, freshDatabase, snapshot } from "../helpers/db";
import type { Database } from "@/db/client";
import { accountTokens, firms, installSteps, users } from "@/db/schema";
import { ACCOUNT_LIMITS, changePassword, completeFirstRun, createFirmFromCommandLine, inspectToken, inviteMember, isFirstRun, requestPasswordReset, setPasswordWithToken, takeRequestSlot } from "@/lib/data/accounts";
import { hashToken, INVITE_TTL_HOURS, RESET_TTL_HOURS } from "@/lib/accounts/tokens";
import { verifyPassword } from "@/lib/auth/password";
import { setStampClock } from "@/lib/clock";
import { startMailListener, type MailListener } from "@/lib/mail/listener";

let db: Database;
let listener: MailListener;
const tokenOf = (link: string) => link.split("/").pop()!;
const address = (n: string) => `198.51.100.${n}`; // documentation range (RFC 5737): never a real caller

beforeAll(async () => {
  process.env.BALLAST_CLOCK = "2026-12-01";
  db = await freshDatabase();
  listener = await startMailListener({});
});
afterAll(async () => {
  delete process.env.SMTP_HOST;
  await listener.close();
});

describe("invitation tokens", () => {
  it("stores only the SHA-256 of the token, works once, and then refuses with nothing changed", async () => {
    const admin = await actorFor("ada.quayle@northmoor.example");
    const invitation = await inviteMember(admin, { name: "Ivo Brandt", email: "ivo.brandt@northmoor.example", roles: ["risk_analyst"] });
    expect(invitation.mail.status).toBe("not_configured");
    const token = tokenOf(invitation.link!);
    const [row] = await db.select().from(accountTokens).where(eq(accountTokens.tokenHash, hashToken(token)));
    expect(row).toMatchObject({ purpose: "invite", usedAt: null });
    // the raw token appears in no column of any table
    expect(JSON.stringify(await snapshot(db))).not.toContain(token);
    // 72 hours from issue
    expect(Date.parse(row.expiresAt) - Date.parse(row.createdAt)).toBe(INVITE_TTL_HOURS * 3_600_000);
    expect((await inspectToken(token, "invite")).state).toBe("valid");
    // an invited person cannot sign in before choosing a password
    const [before] = await db.select().from(users).where(eq(users.email, "ivo.brandt@northmoor.example"));
    expect(await verifyPassword("", before.passwordHash)).toBe(false);

    await setPasswordWithToken(token, "invite", "a-rare-long-passphrase-41", address("1"));
    const [after] = await db.select().from(users).where(eq(users.email, "ivo.brandt@northmoor.example"));
    expect(await verifyPassword("a-rare-long-passphrase-41", after.passwordHash)).toBe(true);
    expect(after.sessionVersion).toBe(before.sessionVersion + 1);

    const unchanged = await snapshot(db);
    await expect(setPasswordWithToken(token, "invite", "another-rare-passphrase-42", address("1"))).rejects.toMatchObject({ code: "conflict:token" });
    expect(await inspectToken(token, "invite")).toEqual({ state: "used" });
    // only the attempt counter moved
    const now = await snapshot(db);
    expect({ ...now, account_requests: [] }).toEqual({ ...unchanged, account_requests: [] });
  });

  it("refuses an expired link and an unknown one, and a reset token used as an invitation", async () => {
    const admin = await actorFor("ada.quayle@northmoor.example");
    setStampClock(new Date(Date.now() - (INVITE_TTL_HOURS + 1) * 3_600_000));
    let link: string;
    try {
      link = (await inviteMember(admin, { name: "Lena Holt", email: "lena.holt@northmoor.example", roles: ["auditor"] })).link!;
    } finally {
      setStampClock(null);
    }
    expect((await inspectToken(tokenOf(link), "invite")).state).toBe("expired");
    await expect(setPasswordWithToken(tokenOf(link), "invite", "a-rare-long-passphrase-43", address("2"))).rejects.toMatchObject({ code: "conflict:token" });
    await expect(setPasswordWithToken("x".repeat(43), "invite", "a-rare-long-passphrase-43", address("2"))).rejects.toMatchObject({ code: "not_found:token" });
    await expect(setPasswordWithToken(tokenOf(link), "reset", "a-rare-long-passphrase-43", address("2"))).rejects.toMatchObject({ code: "not_found:token" });
  });
});

describe("password reset", () => {
  it("answers the same for unknown addresses, mails a one-hour single-use link to a member, and ends their sessions", async () => {
    process.env.SMTP_HOST = "127.0.0.1";
    process.env.SMTP_PORT = String(listener.smtpPort);
    try {
      const before = listener.messages.length;
      await (await requestPasswordReset("nobody@northmoor.example", address("3")))();
      expect(listener.messages.length).toBe(before);
      await (await requestPasswordReset("Oskar.Lind@northmoor.example", address("3")))();
      const mail = listener.messages.at(-1)!;
      expect(mail.to).toEqual(["oskar.lind@northmoor.example"]);
      const token = /reset-password\/([A-Za-z0-9_-]{43})/.exec(mail.text)![1];
      const [row] = await db.select().from(accountTokens).where(eq(accountTokens.tokenHash, hashToken(token)));
      expect(Date.parse(row.expiresAt) - Date.parse(row.createdAt)).toBe(RESET_TTL_HOURS * 3_600_000);
      await setPasswordWithToken(token, "reset", "oskar-new-long-phrase-44", address("3"));
      const [oskar] = await db.select().from(users).where(eq(users.email, "oskar.lind@northmoor.example"));
      expect(await verifyPassword("oskar-new-long-phrase-44", oskar.passwordHash)).toBe(true);
      await expect(setPasswordWithToken(token, "reset", "oskar-other-long-phrase-45", address("3"))).rejects.toMatchObject({ code: "conflict:token" });
    } finally {
      delete process.env.SMTP_HOST;
    }
  });

  it("limits reset requests per e-mail (whether or not it has an account) and per address", async () => {
    const { max } = ACCOUNT_LIMITS["reset.email"];
    for (let i = 0; i < max; i++) await requestPasswordReset("unknown.person@pellam.example", address(`1${i}`));
    await expect(requestPasswordReset("unknown.person@pellam.example", address("99"))).rejects.toMatchObject({ code: "rate_limited:account" });
    const perAddress = ACCOUNT_LIMITS["reset.address"].max;
    for (let i = 0; i < perAddress; i++) await takeRequestSlot("reset.address", address("50"));
    await expect(requestPasswordReset("someone.else@pellam.example", address("50"))).rejects.toMatchObject({ code: "rate_limited:account" });
  });
});

describe("password change", () => {
  it("needs the current password (a wrong one counts as a failed sign-in) and ends every session", async () => {
    const tomas = await actorFor("tomas.reyne@northmoor.example");
    const unchanged = await snapshot(db);
    await expect(changePassword(tomas, { currentPassword: "wrong-password", newPassword: "tomas-new-long-phrase-46", confirm: "tomas-new-long-phrase-46" }, address("4"))).rejects.toMatchObject({ code: "unprocessable:password" });
    const [same] = await db.select().from(users).where(eq(users.email, tomas.email));
    expect(same.passwordHash).toBe((unchanged.users as { email: string; password_hash: string }[]).find((u) => u.email === tomas.email)!.password_hash);
    await changePassword(tomas, { currentPassword: "ballast-demo-2026", newPassword: "tomas-new-long-phrase-46", confirm: "tomas-new-long-phrase-46" }, address("4"));
    const [changed] = await db.select().from(users).where(eq(users.email, tomas.email));
    expect(await verifyPassword("tomas-new-long-phrase-46", changed.passwordHash)).toBe(true);
    expect(changed.sessionVersion).toBe(same.sessionVersion + 1);
  });
});

describe("first run and firm:create", () => {
  it("is closed on an install that holds firms", async () => {
    expect(await isFirstRun()).toBe(false);
    await expect(completeFirstRun({ firmName: "Late Firm", reportingCurrency: "EUR", adminName: "Al Late", adminEmail: "al@late.example", password: "a-rare-long-passphrase-47", confirm: "a-rare-long-passphrase-47" }, address("5"))).rejects.toMatchObject({ code: "conflict:first_run" });
  });

  it("creates the first firm once on an empty install, and refuses a second time", async () => {
    // an empty install: a freshly migrated database file without the demo
    const empty = await freshEmptyDatabase();
    expect(await isFirstRun()).toBe(true);
    const input = { firmName: "Harrow Lane Securities", reportingCurrency: "GBP" as const, adminName: "Mara Quinn", adminEmail: "mara.quinn@harrow.example", password: "a-rare-long-passphrase-48", confirm: "a-rare-long-passphrase-48" };
    const created = await completeFirstRun(input, address("6"));
    const [firm] = await empty.select().from(firms).where(eq(firms.id, created.firmId));
    expect(firm).toMatchObject({ name: "Harrow Lane Securities", reportingCurrency: "GBP", methodCoApproval: true, slug: "harrow-lane-securities" });
    expect(await empty.select().from(installSteps)).toHaveLength(1);
    expect(await isFirstRun()).toBe(false);
    await expect(completeFirstRun({ ...input, firmName: "Second Firm", adminEmail: "x@second.example" }, address("6"))).rejects.toMatchObject({ code: "conflict:first_run" });
    expect(await empty.select().from(firms)).toHaveLength(1);
    // the operator's command line adds further firms with an invitation link for their administrator
    const cli = await createFirmFromCommandLine({ name: "Harrow Lane Securities", currency: "EUR", adminEmail: "Ned.Vale@harrow.example", adminName: "Ned Vale" });
    expect(cli).toMatchObject({ slug: "harrow-lane-securities-2", existingAccount: false });
    expect((await inspectToken(tokenOf(cli.link!), "invite")).state).toBe("valid");
  });
});

async function freshEmptyDatabase(): Promise<Database> {
  const { mkdtempSync } = await import("node:fs");
  const { tmpdir } = await import("node:os");
  const path = await import("node:path");
  const { migrateDatabase } = await import("@/db/migrate");
  const { getDb } = await import("@/db/client");
  const dir = mkdtempSync(path.join(tmpdir(), "ballast-empty-"));
  const url = `file:${path.join(dir, "empty.db")}`;
  process.env.DATABASE_URL = url;
  await migrateDatabase(url);
  return getDb(); // getDb opens the file DATABASE_URL now names
}
