import Link from "next/link";
import type { ReactNode } from "react";

/** The line above a page's header that leads back to the page it belongs to: "← {children}". */
export function BackLink({ href, children }: { href: string; children: ReactNode }) {
  return (
    <p className="mb-2 text-sm">
      <Link href={href} className="underline">
        ← {children}
      </Link>
    </p>
  );
}
