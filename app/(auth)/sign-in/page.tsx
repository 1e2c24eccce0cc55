import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { Logo } from "@/app/_components/logo";
import { getActor } from "@/lib/auth/actor";
import { safeNextPath } from "@/lib/auth/safe-redirect";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";


export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const next = safeNextPath(params.next ?? params.callbackUrl);
  if (await getActor()) redirect(next);
  return (
    <main className="flex min-h-screen items-center justify-center px-4 py-12">
      <div className="w-full max-w-sm">
        <div className="mb-8 flex justify-center">
          <Logo />
        </div>
        <div className="rounded-lg border border-ink-line bg-paper-raised p-6 shadow-sm">
          <h1 className="text-xl font-semibold">Sign in to your firm</h1>
          <p className="mt-1 text-sm text-ink-muted">Use the e-mail address your administrator registered.</p>
          {params.changed === "1" ? (
            <p role="status" className="mt-4 rounded-md border border-ok/30 bg-ok-bg px-3 py-2 text-sm">
              Your password is changed and your sessions have ended. Sign in with the new password.
            </p>
          ) : null}
          <SignInForm next={next} expired={params.expired === "1"} />
          <p className="mt-4 text-sm">
            <Link href="/reset-password" className="underline">
              Forgot your password?
            </Link>
          </p>
        </div>
      </div>
    </main>
  );
}
