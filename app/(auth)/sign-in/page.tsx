import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { Logo } from "@/app/_components/logo";
import { getActor } from "@/lib/auth/actor";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };
export const dynamic = "force-dynamic";

/** Only same-site paths are followed after sign-in. */
function safeNext(value: string | string[] | undefined): string {
  const next = Array.isArray(value) ? value[0] : value;
  return next && next.startsWith("/") && !next.startsWith("//") ? next : "/home";
}

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const next = safeNext(params.next ?? params.callbackUrl);
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
          <SignInForm next={next} expired={params.expired === "1"} />
        </div>
      </div>
    </main>
  );
}
