import type { Metadata } from "next";
import Link from "next/link";
import { Logo } from "@/app/_components/logo";
import { NotFoundNotice } from "@/app/_components/not-found-notice";

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
      <NotFoundNotice title="There is no page at this address" other={{ href: "/", label: "Ballast start page" }}>
        <p>The link may be mistyped or out of date. Nothing was changed by following it.</p>
      </NotFoundNotice>
    </main>
  );
}
