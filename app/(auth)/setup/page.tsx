import type { Metadata } from "next";
import Link from "next/link";
import { isFirstRun } from "@/lib/data/accounts";
import { AuthCard } from "../_components/auth-card";
import { FirstRunForm } from "./first-run-form";

export const metadata: Metadata = { title: "Set up Ballast" };
export const dynamic = "force-dynamic";

/** The first run of an empty install: the firm and its first administrator, once (public while no firm exists). */
export default async function SetupPage() {
  if (!(await isFirstRun())) {
    return (
      <AuthCard title="Ballast is set up">
        <p className="mt-4 text-sm">This installation already has its firm. Sign in, or ask your administrator for an invitation.</p>
        <Link href="/sign-in" className="mt-4 inline-block text-sm underline">
          Sign in
        </Link>
      </AuthCard>
    );
  }
  return (
    <AuthCard
      wide
      title="Set up Ballast"
      lead="This installation has no firm yet. Create your firm and its first administrator; this screen works once. The administrator then invites everyone else by e-mail."
    >
      <FirstRunForm />
    </AuthCard>
  );
}
