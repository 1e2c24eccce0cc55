import type { Metadata } from "next";
import { BackLink } from "@/app/_components/back-link";
import { PageHeader } from "@/app/_components/page-header";
import { pageActor } from "@/lib/auth/page";
import { ChangePasswordForm } from "./change-password-form";

export const metadata: Metadata = { title: "Your account" };

/** One's own account: name, e-mail, and changing the password (every member). */
export default async function AccountPage() {
  const { actor } = await pageActor();
  return (
    <>
      <BackLink href="/settings">Settings</BackLink>
      <PageHeader title="Your account" lead={`${actor.name} · ${actor.email}`} />
      <section aria-labelledby="password-heading" className="max-w-md rounded-lg border border-ink-line bg-paper-raised p-5">
        <h2 id="password-heading" className="text-lg font-semibold">
          Change your password
        </h2>
        <p className="mt-1 text-sm text-ink-muted">Every session of your account ends, this one included; you sign in again with the new password.</p>
        <ChangePasswordForm email={actor.email} />
      </section>
    </>
  );
}
