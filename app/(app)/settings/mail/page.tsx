import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { Forbidden } from "@/app/_components/forbidden";
import { pageActor } from "@/lib/auth/page";
import { mailListenerUrl } from "@/lib/mail/inbox";
import { MailInbox } from "./mail-inbox";

export const metadata: Metadata = { title: "Mail received" };

/** What the local SMTP listener received for this firm: only while that listener is the configured transport. */
export default async function MailPage() {
  const { allowed } = await pageActor("mail.read");
  if (!allowed) return <Forbidden what="The mail received by the local listener is for administrators." />;
  const listener = mailListenerUrl();
  return (
    <>
      <PageHeader
        title="Mail received"
        lead="In the demo, development and tests, Ballast sends its e-mail to a mail listener on this machine instead of the outside world. These are the messages it received for your firm."
        actions={
          <Link href="/calendar" className="text-sm underline">
            Reminder delivery
          </Link>
        }
      />
      {listener ? (
        <MailInbox />
      ) : (
        <p className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6 text-ink-soft">
          E-mail goes to a real mail server here (SMTP_HOST); there is no local listener to show. Delivery status is on the Calendar page.
        </p>
      )}
    </>
  );
}
