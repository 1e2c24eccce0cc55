import { route } from "@/lib/auth/route";
import { readInbox } from "@/lib/mail/inbox";

/** What the local mail listener received for this firm (administrators; only while the listener is configured). */
export const GET = route({ permission: "mail.read" }, async ({ actor }) => ({ messages: await readInbox(actor) }));
