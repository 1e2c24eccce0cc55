import Link from "next/link";
import type { ReactNode } from "react";
import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { ProblemNotice } from "@/app/_components/problem-notice";

/** The 404 notice both not-found pages show: a title, what happened, "Go to this month" and one other way on. */
export function NotFoundNotice({ title, other, children }: { title: string; other: { href: string; label: string }; children: ReactNode }) {
  return (
    <ProblemNotice
      code="Not found"
      title={title}
      actions={
        <>
          <Link href="/home" className={primaryButtonClass}>
            Go to this month
          </Link>
          <Link href={other.href} className={secondaryButtonClass}>
            {other.label}
          </Link>
        </>
      }
    >
      {children}
    </ProblemNotice>
  );
}
