/**
 * What the local mail listener received, for the admin's "Mail received" page. Only while MAIL_LISTENER_URL names
 * the listener (demo, development, tests); each firm sees only the messages that carry its X-Ballast-Firm header.
 */
import "server-only";
import type { Actor } from "@/lib/auth/actor";
import { AppError } from "@/lib/errors";
import type { ReceivedMessage } from "./listener";

/** The listener's JSON address, when the configured transport is the local listener. */
export function mailListenerUrl(): string | null {
  const url = process.env.MAIL_LISTENER_URL?.trim();
  return url ? url.replace(/\/+$/, "") : null;
}

export type InboxMessage = Omit<ReceivedMessage, "firmId">;

/** The actor's firm's messages, newest first. */
export async function readInbox(actor: Actor): Promise<InboxMessage[]> {
  const url = mailListenerUrl();
  if (!url) throw new AppError("not_found:mail", "No local mail listener is configured (MAIL_LISTENER_URL is not set).");
  let data: { messages?: ReceivedMessage[] };
  try {
    const response = await fetch(`${url}/messages`, { cache: "no-store", signal: AbortSignal.timeout(5000) });
    if (!response.ok) throw new Error(`status ${response.status}`);
    data = await response.json();
  } catch (error) {
    throw new AppError("unavailable:mail", `The local mail listener at ${url} is not answering (${error instanceof Error ? error.message : "no answer"}). Start it with the demo or npm run dev.`);
  }
  return (data.messages ?? [])
    .filter((m) => m.firmId === actor.firmId)
    .map(({ firmId: _firmId, ...rest }) => rest)
    .reverse();
}
