import type { Metadata } from "next";
import { TokenPage } from "../../_components/token-page";

export const metadata: Metadata = { title: "Choose your password" };
export const dynamic = "force-dynamic";

/** An invitation link: the invited person chooses their own password (public; the token is the credential). */
export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return <TokenPage token={token} purpose="invite" />;
}
