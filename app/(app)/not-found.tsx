import Link from "next/link";
import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { ProblemNotice } from "@/app/_components/problem-notice";

/**
 * A signed-in page that called notFound(): the record does not exist or belongs to another firm (the two are
 * answered alike, so nothing about another firm's records shows). Rendered inside the shell, answered with 404.
 */
export default function NotFound() {
  return (
    <ProblemNotice
      code="Not found"
      title="Nothing to show here"
      actions={
        <>
          <Link href="/home" className={primaryButtonClass}>
            Go to this month
          </Link>
          <Link href="/periods" className={secondaryButtonClass}>
            All periods
          </Link>
        </>
      }
    >
      <p>This record does not exist for your firm, or the link is out of date. Pick it again from the list it came from.</p>
    </ProblemNotice>
  );
}
