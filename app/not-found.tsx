import type { Metadata } from "next";
import Link from "next/link";
import { Logo } from "@/app/_components/logo";
import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { ProblemNotice } from "@/app/_components/problem-notice";

export const metadata: Metadata = { title: "Page not found" };

/** An address that matches no page (answered with status 404), outside the signed-in shell. */
export default function NotFound() {
  return (
    <main className="min-h-screen bg-paper px-4 py-10 text-ink">
      <div className="mx-auto max-w-xl">
        <Link href="/" aria-label="Ballast">
          <Logo />
        </Link>
      </div>
      <ProblemNotice
        code="Not found"
        title="There is no page at this address"
        actions={
          <>
            <Link href="/home" className={primaryButtonClass}>
              Go to this month
            </Link>
            <Link href="/" className={secondaryButtonClass}>
              Ballast start page
            </Link>
          </>
        }
      >
        <p>The link may be mistyped or out of date. Nothing was changed by following it.</p>
      </ProblemNotice>
    </main>
  );
}
