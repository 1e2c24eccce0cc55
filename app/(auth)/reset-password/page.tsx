import type { Metadata } from "next";
import { AuthCard } from "../_components/auth-card";
import { ResetRequestForm } from "./reset-request-form";

export const metadata: Metadata = { title: "Reset your password" };
// rendered per request, so that its scripts carry the request's CSP nonce (proxy.ts)
export const dynamic = "force-dynamic";

/** Ask for a password-reset link by e-mail (public). */
export default function ResetPasswordPage() {
  return (
    <AuthCard title="Reset your password" lead="Give the e-mail address you sign in with. Ballast sends a link to choose a new password.">
      <ResetRequestForm />
    </AuthCard>
  );
}
