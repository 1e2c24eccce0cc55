import Link from "next/link";
import { inspectToken } from "@/lib/data/accounts";
import { AuthCard } from "./auth-card";
import { SetPasswordForm } from "./set-password-form";

const REFUSED = {
  used: "This link has already been used. Sign in with the password you chose, or ask for a new link.",
  expired: "This link has expired.",
  unknown: "This link is not valid. Check that the whole link was copied from the e-mail.",
} as const;

/** The page behind an invitation or reset link: the form while the link is valid, a plain refusal otherwise. */
export async function TokenPage({ token, purpose }: { token: string; purpose: "invite" | "reset" }) {
  const info = await inspectToken(token, purpose);
  const title = purpose === "invite" ? "Choose your password" : "Choose a new password";
  if (info.state !== "valid") {
    return (
      <AuthCard title={purpose === "invite" ? "Invitation link" : "Password reset link"}>
        <p role="alert" className="mt-4 text-sm">
          {REFUSED[info.state]} {purpose === "invite" ? "Ask your administrator to send the invitation again." : null}
        </p>
        <div className="mt-4 flex gap-4 text-sm">
          <Link href="/sign-in" className="underline">
            Sign in
          </Link>
          <Link href="/reset-password" className="underline">
            Ask for a reset link
          </Link>
        </div>
      </AuthCard>
    );
  }
  return (
    <AuthCard
      title={title}
      lead={
        purpose === "invite"
          ? `${info.name}, you are invited to ${info.firmName ?? "a firm"} in Ballast as ${info.email}. The link works once, until ${info.expiresAt!.slice(0, 16).replace("T", " ")} UTC.`
          : `For ${info.email}. The link works once, until ${info.expiresAt!.slice(0, 16).replace("T", " ")} UTC; every signed-in session of the account ends.`
      }
    >
      <SetPasswordForm token={token} purpose={purpose} email={info.email!} />
    </AuthCard>
  );
}
