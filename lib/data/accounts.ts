/**
 * Accounts: invitations, setting a password through a single-use link, password reset and change, the install's
 * first run and the operator's `firm:create`. Functions that run before anyone is signed in (a link, a reset, the
 * first run) take no Actor: they find their rows by the token's hash or the e-mail, never by a firm the caller
 * names. Everything else takes the Actor and stays in the actor's firm.
 */
import "server-only";
import { randomUUID } from "node:crypto";
import { and, count, eq, gte, inArray, isNull } from "drizzle-orm";
import { getDb, type Database, type Tx } from "@/db/client";
import { accountRequests, accountTokens, auditEvents, calendarSettings, capitalRuleProfiles, firms, installSteps, memberships, users } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { recordAudit } from "@/lib/audit/record";
import type { Actor } from "@/lib/auth/actor";
import { hashPassword, verifyPassword } from "@/lib/auth/password";
import { isSignInBlocked, recordSignInAttempt } from "@/lib/auth/rate-limit";
import { now } from "@/lib/clock";
import { describeMailError, getMailer, type OutgoingMail } from "@/lib/mail/transport";
import { isCommonPassword } from "@/lib/validation/common-passwords";
import type { ChangePasswordInput, FirstRunInput, InviteInput } from "@/lib/validation/accounts";
import { BASEL_PLUS_FACTORS, DEFAULT_DEADLINE, slugOf } from "@/lib/accounts/firm-defaults";
import { invitationMessage, resetMessage } from "@/lib/accounts/messages";
import { expiryOf, hashToken, looksLikeToken, newToken, tokenLink, type TokenPurpose } from "@/lib/accounts/tokens";

/** Request limits outside sign-in: at most `max` per key in `minutes`. */
export const ACCOUNT_LIMITS = {
  "reset.email": { max: 3, minutes: 60 },
  "reset.address": { max: 10, minutes: 60 },
  "token.address": { max: 20, minutes: 15 },
  "invite.firm": { max: 30, minutes: 60 },
  "first-run.address": { max: 10, minutes: 15 },
} as const;
export type LimitKind = keyof typeof ACCOUNT_LIMITS;

/**
 * Count one request of `kind` for `key`; throws a 429 AppError when the window already holds the limit. Inside a
 * write's transaction (`db` = tx) the request counts only if the write stands.
 */
export async function takeRequestSlot(kind: LimitKind, key: string, db: Tx | ReturnType<typeof getDb> = getDb(), at = new Date()): Promise<void> {
  const { max, minutes } = ACCOUNT_LIMITS[kind];
  const since = new Date(at.getTime() - minutes * 60_000).toISOString();
  const [{ n }] = await db.select({ n: count() }).from(accountRequests).where(and(eq(accountRequests.kind, kind), eq(accountRequests.key, key), gte(accountRequests.at, since)));
  if (n >= max) {
    throw new AppError("rate_limited:account", `Too many requests of this kind; wait ${minutes} minutes and try again.`);
  }
  await db.insert(accountRequests).values({ kind, key, at: at.toISOString() });
}

/** A password nobody knows: the account exists but cannot sign in until its owner sets one through a link. */
async function unusablePasswordHash(): Promise<string> {
  return hashPassword(`${randomUUID()}${randomUUID()}`);
}

function refuseCommon(password: string, field = "password"): void {
  if (isCommonPassword(password)) throw new AppError("unprocessable:password", "Choose a less common password.", { [field]: "This password is too common; choose another." });
}

/** The base URL links point to (BALLAST_URL, or the local server). */
export function appBaseUrl(): string {
  return (process.env.BALLAST_URL || `http://localhost:${process.env.PORT ?? 3000}`).replace(/\/+$/, "");
}

export type MailOutcome = { status: "sent" } | { status: "failed"; message: string } | { status: "not_configured" };

/** Send one message through the configured transport, reporting the outcome instead of throwing. */
async function sendMail(message: OutgoingMail): Promise<MailOutcome> {
  const mailer = getMailer();
  if (!mailer) return { status: "not_configured" };
  try {
    await mailer.send(message);
    return { status: "sent" };
  } catch (error) {
    return { status: "failed", message: describeMailError(error, mailer.describe) };
  }
}

async function issueToken(tx: Tx, input: { userId: string; firmId: string | null; purpose: TokenPurpose; createdBy: string | null }) {
  const token = newToken();
  const issuedAt = now();
  const expiresAt = expiryOf(input.purpose, issuedAt).toISOString();
  await tx.insert(accountTokens).values({ ...input, tokenHash: hashToken(token), expiresAt, createdAt: issuedAt.toISOString() });
  return { token, expiresAt };
}

// ---------------------------------------------------------------------------------------------------------------
// A new firm: the first-run screen and the operator's command line

export interface NewFirmResult {
  firmId: string;
  firmName: string;
  slug: string;
  adminUserId: string;
  /** the admin's single-use invitation link (null when the admin chose a password on the first-run screen, or already had an account) */
  link: string | null;
  expiresAt: string | null;
  existingAccount: boolean;
}

async function uniqueSlug(tx: Tx, name: string): Promise<string> {
  const base = slugOf(name);
  for (let i = 1; ; i++) {
    const slug = i === 1 ? base : `${base}-${i}`;
    const [taken] = await tx.select({ id: firms.id }).from(firms).where(eq(firms.slug, slug));
    if (!taken) return slug;
  }
}

/** The firm's rows as the demo seed makes them: the firm (co-approval on), its calendar rule, its capital rule profile. */
async function insertFirm(tx: Tx, input: { name: string; currency: string }) {
  const [firm] = await tx
    .insert(firms)
    .values({ name: input.name, slug: await uniqueSlug(tx, input.name), reportingCurrency: input.currency, methodCoApproval: true })
    .returning();
  await tx.insert(calendarSettings).values({ firmId: firm.id, ...DEFAULT_DEADLINE });
  await tx.insert(capitalRuleProfiles).values({ firmId: firm.id, plusFactors: BASEL_PLUS_FACTORS });
  return firm;
}

/**
 * `npm run firm:create`: a firm, its default calendar and capital rule rows, and its first administrator — an
 * invitation link for a new address, or a membership for an address that already has an account.
 */
export async function createFirmFromCommandLine(input: { name: string; currency: string; adminEmail: string; adminName: string }): Promise<NewFirmResult> {
  const email = input.adminEmail.trim().toLowerCase();
  const unusable = await unusablePasswordHash();
  const result = await getDb().transaction(async (tx) => {
    const firm = await insertFirm(tx, input);
    let [user] = await tx.select().from(users).where(eq(users.email, email));
    const existingAccount = Boolean(user);
    if (!user) [user] = await tx.insert(users).values({ email, name: input.adminName, passwordHash: unusable }).returning();
    const [membership] = await tx.insert(memberships).values({ firmId: firm.id, userId: user.id, roles: ["admin"] }).returning();
    const system = { firmId: firm.id, actorId: null, actorName: "Operator (firm:create)", at: now().toISOString() };
    await tx.insert(auditEvents).values({ ...system, action: "firm.create", entityType: "firm", entityId: firm.id, summary: `Created the firm ${firm.name} (${firm.reportingCurrency}) from the command line` });
    await tx.insert(auditEvents).values({ ...system, action: "member.invite", entityType: "membership", entityId: membership.id, summary: `Invited ${user.name} <${email}> as admin`, detail: { roles: ["admin"], existingAccount } });
    const issued = existingAccount ? null : await issueToken(tx, { userId: user.id, firmId: firm.id, purpose: "invite", createdBy: null });
    return { firm, user, existingAccount, issued };
  });
  return {
    firmId: result.firm.id,
    firmName: result.firm.name,
    slug: result.firm.slug,
    adminUserId: result.user.id,
    link: result.issued ? tokenLink(appBaseUrl(), "invite", result.issued.token) : null,
    expiresAt: result.issued?.expiresAt ?? null,
    existingAccount: result.existingAccount,
  };
}

/** Send the first administrator's invitation of a firm made on the command line (null when no mail is configured). */
export async function mailFirstAdmin(created: NewFirmResult, to: { email: string; name: string }): Promise<MailOutcome> {
  return sendMail(
    invitationMessage({
      to: to.email,
      name: to.name,
      firmName: created.firmName,
      firmId: created.firmId,
      inviterName: "Your Ballast operator",
      roles: ["Administrator"],
      link: created.link,
      signInUrl: `${appBaseUrl()}/sign-in`,
      expiresAt: created.expiresAt,
    }),
  );
}

/** Whether this install has no firm yet (the first-run screen is open only then). */
export async function isFirstRun(): Promise<boolean> {
  const [{ n }] = await getDb().select({ n: count() }).from(firms);
  if (n > 0) return false;
  const [mark] = await getDb().select({ id: installSteps.id }).from(installSteps).where(eq(installSteps.id, "first-run"));
  return !mark;
}

/**
 * The first-run screen: creates the install's first firm and its administrator with the password they chose, once.
 * Refused when any firm exists or the first run was done before; the mark row's primary key makes a second,
 * simultaneous try fail inside its transaction.
 */
export async function completeFirstRun(input: FirstRunInput, address: string): Promise<{ firmId: string; email: string }> {
  await takeRequestSlot("first-run.address", address);
  if (!(await isFirstRun())) throw new AppError("conflict:first_run", "This installation is already set up; sign in instead.");
  refuseCommon(input.password);
  const passwordHash = await hashPassword(input.password);
  const email = input.adminEmail;
  try {
    return await getDb().transaction(async (tx) => {
      const [{ n }] = await tx.select({ n: count() }).from(firms);
      if (n > 0) throw new AppError("conflict:first_run", "This installation is already set up; sign in instead.");
      const at = now().toISOString();
      await tx.insert(installSteps).values({ id: "first-run", at, detail: { firmName: input.firmName, adminEmail: email } });
      const firm = await insertFirm(tx, { name: input.firmName, currency: input.reportingCurrency });
      const [user] = await tx.insert(users).values({ email, name: input.adminName, passwordHash }).returning();
      const [membership] = await tx.insert(memberships).values({ firmId: firm.id, userId: user.id, roles: ["admin"] }).returning();
      const actor = { userId: user.id, name: user.name, firmId: firm.id };
      await recordAudit(tx, actor, { action: "firm.create", entityType: "firm", entityId: firm.id, summary: `Created the firm ${firm.name} (${firm.reportingCurrency}) on the first-run screen`, at });
      await recordAudit(tx, actor, { action: "member.add", entityType: "membership", entityId: membership.id, summary: `Added ${user.name} <${email}> as admin (the firm's first administrator)`, detail: { roles: ["admin"] }, at });
      return { firmId: firm.id, email };
    });
  } catch (error) {
    if (error instanceof AppError) throw error;
    // the mark's primary key: another first run won the race
    if (/UNIQUE|PRIMARY KEY|constraint/i.test(String((error as Error)?.message ?? error))) throw new AppError("conflict:first_run", "This installation is already set up; sign in instead.");
    throw error;
  }
}

// ---------------------------------------------------------------------------------------------------------------
// Invitations

export interface InvitationOutcome {
  memberId: string;
  mail: MailOutcome;
  /** the link, only when no mail transport is configured (the administrator passes it on themselves) */
  link: string | null;
  expiresAt: string | null;
}

/**
 * Invite a person with roles. A new address gets an account without a usable password and a single-use link to
 * choose one; an address that already has an account (at another firm) is added and told to sign in as before.
 * The administrator's answer is the same either way.
 */
export async function inviteMember(actor: Actor, input: InviteInput): Promise<InvitationOutcome> {
  const unusable = await unusablePasswordHash();
  const db = getDb();
  const done = await db.transaction(async (tx) => {
    await takeRequestSlot("invite.firm", actor.firmId, tx);
    let [user] = await tx.select().from(users).where(eq(users.email, input.email));
    const existingAccount = Boolean(user);
    if (!user) [user] = await tx.insert(users).values({ email: input.email, name: input.name, passwordHash: unusable }).returning();
    const [existing] = await tx.select().from(memberships).where(and(eq(memberships.firmId, actor.firmId), eq(memberships.userId, user.id)));
    if (existing) throw new AppError("conflict:member", "This person is already a member of the firm.", { email: "Already a member of this firm." });
    const [membership] = await tx.insert(memberships).values({ firmId: actor.firmId, userId: user.id, roles: input.roles }).returning();
    const issued = existingAccount ? null : await issueToken(tx, { userId: user.id, firmId: actor.firmId, purpose: "invite", createdBy: actor.userId });
    await recordAudit(tx, actor, {
      action: "member.invite",
      entityType: "membership",
      entityId: membership.id,
      summary: `Invited ${input.name} <${input.email}> as ${input.roles.join(", ")}`,
      detail: { roles: input.roles, expiresAt: issued?.expiresAt ?? null },
    });
    return { membership, user, issued, existingAccount };
  });
  return deliverInvitation(actor, { memberId: done.membership.id, email: input.email, name: done.user.name, roles: input.roles, issued: done.issued });
}

async function deliverInvitation(
  actor: Actor,
  input: { memberId: string; email: string; name: string; roles: string[]; issued: { token: string; expiresAt: string } | null },
): Promise<InvitationOutcome> {
  const { ROLE_LABELS } = await import("@/lib/auth/roles");
  const link = input.issued ? tokenLink(appBaseUrl(), "invite", input.issued.token) : null;
  const mail = await sendMail(
    invitationMessage({
      to: input.email,
      name: input.name,
      firmName: actor.firmName,
      firmId: actor.firmId,
      inviterName: actor.name,
      roles: input.roles.map((r) => ROLE_LABELS[r as keyof typeof ROLE_LABELS] ?? r),
      link,
      signInUrl: `${appBaseUrl()}/sign-in`,
      expiresAt: input.issued?.expiresAt ?? null,
    }),
  );
  await recordAudit(getDb(), actor, {
    action: mail.status === "sent" ? "member.invite_mail" : "member.invite_mail_failed",
    entityType: "membership",
    entityId: input.memberId,
    summary: mail.status === "sent" ? `Sent the invitation to ${input.email}` : mail.status === "failed" ? `The invitation to ${input.email} was not sent: ${mail.message}` : `No mail transport is configured; the invitation link for ${input.email} was shown to ${actor.name}`,
  });
  return { memberId: input.memberId, mail, link: mail.status === "not_configured" ? link : null, expiresAt: input.issued?.expiresAt ?? null };
}

/** Send a member who has not yet chosen a password a fresh invitation; earlier links stop working. */
export async function resendInvitation(actor: Actor, memberId: string): Promise<InvitationOutcome> {
  const db = getDb();
  const [row] = await db
    .select({ m: memberships, u: users })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.id, memberId), eq(memberships.firmId, actor.firmId)));
  if (!row) throw new AppError("not_found:member");
  const pending = await pendingInvitations(actor, [row.u.id]);
  if (!pending.has(row.u.id)) throw new AppError("conflict:member", `${row.u.name} has already chosen a password; they sign in, or reset it themselves.`);
  const issued = await db.transaction(async (tx) => {
    await takeRequestSlot("invite.firm", actor.firmId, tx);
    await tx
      .update(accountTokens)
      .set({ usedAt: now().toISOString() })
      .where(and(eq(accountTokens.userId, row.u.id), eq(accountTokens.purpose, "invite"), isNull(accountTokens.usedAt)));
    const fresh = await issueToken(tx, { userId: row.u.id, firmId: actor.firmId, purpose: "invite", createdBy: actor.userId });
    await recordAudit(tx, actor, { action: "member.invite_again", entityType: "membership", entityId: memberId, summary: `Invited ${row.u.name} <${row.u.email}> again; earlier links no longer work`, detail: { expiresAt: fresh.expiresAt } });
    return fresh;
  });
  return deliverInvitation(actor, { memberId, email: row.u.email, name: row.u.name, roles: row.m.roles, issued });
}

/** Of these users (members of the actor's firm), who has an invitation from this firm and never chose a password: user id → its expiry. */
export async function pendingInvitations(actor: Actor, userIds: string[]): Promise<Map<string, string>> {
  if (userIds.length === 0) return new Map();
  const rows = await getDb()
    .select()
    .from(accountTokens)
    .where(and(eq(accountTokens.firmId, actor.firmId), eq(accountTokens.purpose, "invite"), inArray(accountTokens.userId, userIds)));
  const result = new Map<string, string>();
  const chose = new Set<string>();
  const resets = await getDb().select({ userId: accountTokens.userId, usedAt: accountTokens.usedAt, purpose: accountTokens.purpose }).from(accountTokens).where(inArray(accountTokens.userId, userIds));
  for (const r of resets) if (r.purpose === "reset" && r.usedAt) chose.add(r.userId);
  for (const r of rows) {
    // a used invitation that was not replaced by a newer one means the person chose their password
    if (r.usedAt && !rows.some((o) => o.userId === r.userId && o.createdAt > r.createdAt)) chose.add(r.userId);
  }
  for (const r of rows) {
    if (chose.has(r.userId) || r.usedAt) continue;
    const before = result.get(r.userId);
    if (!before || r.expiresAt > before) result.set(r.userId, r.expiresAt);
  }
  return result;
}

// ---------------------------------------------------------------------------------------------------------------
// Links: what a link is for, and using it

export type TokenState = "valid" | "used" | "expired" | "unknown";

/** What a link is, for its page: valid, used, expired or unknown, and whose. Reveals nothing for an unknown token. */
export async function inspectToken(token: string, purpose: TokenPurpose): Promise<{ state: TokenState; email?: string; name?: string; firmName?: string; expiresAt?: string }> {
  if (!looksLikeToken(token)) return { state: "unknown" };
  const [row] = await getDb().select().from(accountTokens).where(and(eq(accountTokens.tokenHash, hashToken(token)), eq(accountTokens.purpose, purpose)));
  if (!row) return { state: "unknown" };
  if (row.usedAt) return { state: "used" };
  if (row.expiresAt <= now().toISOString()) return { state: "expired" };
  const [user] = await getDb().select().from(users).where(eq(users.id, row.userId));
  const [firm] = row.firmId ? await getDb().select().from(firms).where(eq(firms.id, row.firmId)) : [];
  return { state: "valid", email: user?.email, name: user?.name, firmName: firm?.name, expiresAt: row.expiresAt };
}

const TOKEN_REFUSALS: Record<Exclude<TokenState, "valid">, string> = {
  used: "This link has already been used. Sign in, or ask for a new link.",
  expired: "This link has expired. Ask your administrator for a new invitation, or ask for a new reset link.",
  unknown: "This link is not valid. Check that the whole link was copied, or ask for a new one.",
};

/**
 * Choose a password through a single-use link: the token is claimed (unused, unexpired) in the same transaction as
 * the new password and its audit records, so a link works exactly once. Every session of the account ends.
 */
export async function setPasswordWithToken(token: string, purpose: TokenPurpose, password: string, address: string): Promise<{ email: string }> {
  await takeRequestSlot("token.address", address);
  if (!looksLikeToken(token)) throw new AppError("not_found:token", TOKEN_REFUSALS.unknown);
  refuseCommon(password);
  const passwordHash = await hashPassword(password);
  const tokenHash = hashToken(token);
  const at = now().toISOString();
  return getDb().transaction(async (tx) => {
    const [claimed] = await tx
      .update(accountTokens)
      .set({ usedAt: at })
      .where(and(eq(accountTokens.tokenHash, tokenHash), eq(accountTokens.purpose, purpose), isNull(accountTokens.usedAt), gte(accountTokens.expiresAt, at)))
      .returning();
    if (!claimed) {
      const [row] = await tx.select().from(accountTokens).where(and(eq(accountTokens.tokenHash, tokenHash), eq(accountTokens.purpose, purpose)));
      const state: Exclude<TokenState, "valid"> = !row ? "unknown" : row.usedAt ? "used" : "expired";
      throw new AppError(state === "unknown" ? "not_found:token" : "conflict:token", TOKEN_REFUSALS[state]);
    }
    const [user] = await tx.select().from(users).where(eq(users.id, claimed.userId));
    if (!user) throw new AppError("not_found:token", TOKEN_REFUSALS.unknown);
    await tx.update(users).set({ passwordHash, sessionVersion: user.sessionVersion + 1 }).where(eq(users.id, user.id));
    // any other open link of the same kind stops working too
    await tx.update(accountTokens).set({ usedAt: at }).where(and(eq(accountTokens.userId, user.id), eq(accountTokens.purpose, purpose), isNull(accountTokens.usedAt)));
    const firmIds = purpose === "invite" && claimed.firmId ? [claimed.firmId] : await memberFirmIds(tx, user.id);
    for (const firmId of firmIds) {
      await recordAudit(tx, { userId: user.id, name: user.name, firmId }, {
        action: purpose === "invite" ? "account.password_set" : "account.password_reset",
        entityType: "user",
        entityId: user.id,
        summary: purpose === "invite" ? `${user.name} accepted the invitation and chose a password` : `${user.name} reset their password through an e-mailed link; their sessions ended`,
        at,
      });
    }
    return { email: user.email };
  });
}

async function memberFirmIds(tx: Tx | Database, userId: string): Promise<string[]> {
  const rows = await tx.select({ firmId: memberships.firmId }).from(memberships).where(and(eq(memberships.userId, userId), eq(memberships.active, true)));
  return rows.map((r) => r.firmId);
}

// ---------------------------------------------------------------------------------------------------------------
// Reset and change

/** The one answer to a reset request, whether or not the address has an account. */
export const RESET_ANSWER = "If that address belongs to a Ballast account, a link to choose a new password is on its way. It works once, for one hour.";

/**
 * A reset request. Rate limited per address and per e-mail (whether or not it has an account), then returns the
 * work to do after the answer has gone out — so that the answer, and its timing, are the same for any address.
 */
export async function requestPasswordReset(email: string, address: string): Promise<() => Promise<void>> {
  const normalised = email.trim().toLowerCase();
  await takeRequestSlot("reset.address", address);
  await takeRequestSlot("reset.email", normalised);
  return async () => {
    const db = getDb();
    const [user] = await db.select().from(users).where(eq(users.email, normalised));
    if (!user || !user.active) return;
    const firmIds = await memberFirmIds(db, user.id);
    if (firmIds.length === 0) return;
    const issued = await db.transaction(async (tx) => {
      const fresh = await issueToken(tx, { userId: user.id, firmId: null, purpose: "reset", createdBy: null });
      for (const firmId of firmIds) {
        await recordAudit(tx, { userId: user.id, name: user.name, firmId }, { action: "account.reset_request", entityType: "user", entityId: user.id, summary: `A password reset link was sent to ${user.email}`, detail: { expiresAt: fresh.expiresAt } });
      }
      return fresh;
    });
    const outcome = await sendMail(resetMessage({ to: user.email, name: user.name, firmId: firmIds[0], link: tokenLink(appBaseUrl(), "reset", issued.token), expiresAt: issued.expiresAt }));
    if (outcome.status !== "sent") console.error(`[accounts] reset mail to a member was not sent: ${outcome.status === "failed" ? outcome.message : "no mail transport configured"}`);
  };
}

/**
 * Change one's own password: the current password is required (a wrong one counts as a failed sign-in, so the
 * sign-in limit applies); every session ends, this one included, and the person signs in again.
 */
export async function changePassword(actor: Actor, input: ChangePasswordInput, address: string): Promise<void> {
  if (await isSignInBlocked(actor.email, address)) throw new AppError("rate_limited:password", "Too many wrong passwords; wait 15 minutes and try again.");
  const db = getDb();
  const [user] = await db.select().from(users).where(eq(users.id, actor.userId));
  if (!user) throw new AppError("unauthorized:auth");
  if (!(await verifyPassword(input.currentPassword, user.passwordHash))) {
    await recordSignInAttempt(actor.email, address, false);
    await recordAudit(db, actor, { action: "account.password_change_refused", entityType: "user", entityId: user.id, summary: `${user.name} gave a wrong current password when changing it; nothing changed` });
    throw new AppError("unprocessable:password", "The current password is not correct. Nothing was changed.", { currentPassword: "The current password is not correct." });
  }
  if (input.newPassword === input.currentPassword) throw new AppError("unprocessable:password", "The new password is the same as the current one.", { newPassword: "Choose a password different from the current one." });
  refuseCommon(input.newPassword, "newPassword");
  const passwordHash = await hashPassword(input.newPassword);
  await db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash, sessionVersion: user.sessionVersion + 1 }).where(eq(users.id, user.id));
    await tx.update(accountTokens).set({ usedAt: now().toISOString() }).where(and(eq(accountTokens.userId, user.id), eq(accountTokens.purpose, "reset"), isNull(accountTokens.usedAt)));
    for (const firmId of await memberFirmIds(tx, user.id)) {
      await recordAudit(tx, { userId: user.id, name: user.name, firmId }, { action: "account.password_change", entityType: "user", entityId: user.id, summary: `${user.name} changed their password; their sessions ended` });
    }
  });
}
