import type { Metadata } from "next";
import { TokenPage } from "../../_components/token-page";

export const metadata: Metadata = { title: "Choose a new password" };
export const dynamic = "force-dynamic";

/** A password-reset link (public; the token is the credential). */
export default async function ResetLinkPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return <TokenPage token={token} purpose="reset" />;
}
