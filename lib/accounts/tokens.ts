/**
 * Single-use account tokens (invitations and password resets): 32 random bytes, base64url in the link; only their
 * SHA-256 is stored. Pure helpers, no database.
 */
import { createHash, randomBytes } from "node:crypto";

/** Hours an invitation link stays valid. */
export const INVITE_TTL_HOURS = 72;
/** Hours a password-reset link stays valid. */
export const RESET_TTL_HOURS = 1;

export type TokenPurpose = "invite" | "reset";

/** A new random token (43 characters of base64url, 256 bits). */
export function newToken(): string {
  return randomBytes(32).toString("base64url");
}

/** The stored form of a token: its SHA-256 in hex. */
export function hashToken(token: string): string {
  return createHash("sha256").update(token, "utf8").digest("hex");
}

/** Whether a string has the shape of a token (so that garbage is refused before any lookup). */
export function looksLikeToken(token: string): boolean {
  return /^[A-Za-z0-9_-]{43}$/.test(token);
}

/** The expiry of a token issued at `issuedAt` for `purpose`. */
export function expiryOf(purpose: TokenPurpose, issuedAt: Date): Date {
  const hours = purpose === "invite" ? INVITE_TTL_HOURS : RESET_TTL_HOURS;
  return new Date(issuedAt.getTime() + hours * 3_600_000);
}

/** The link a person opens to set their password. */
export function tokenLink(baseUrl: string, purpose: TokenPurpose, token: string): string {
  return `${baseUrl.replace(/\/+$/, "")}/${purpose === "invite" ? "invitation" : "reset-password"}/${token}`;
}
