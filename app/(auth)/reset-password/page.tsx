import type { Metadata } from "next";
import { AuthCard } from "../_components/auth-card";
import { ResetRequestForm } from "./reset-request-form";

export const metadata: Metadata = { title: "Reset your password" };

/** Ask for a password-reset link by e-mail (public). */
export default function ResetPasswordPage() {
  return (
    <AuthCard title="Reset your password" lead="Give the e-mail address you sign in with. Ballast sends a link to choose a new password.">
      <ResetRequestForm />
    </AuthCard>
  );
}
