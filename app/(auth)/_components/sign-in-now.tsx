import Link from "next/link";
import type { ReactNode } from "react";
import { primaryButtonClass } from "@/app/_components/field";

/** What a signed-out form shows once it has done its work: what happened (announced) and the way to sign in. */
export function SignInNow({ children }: { children: ReactNode }) {
  return (
    <div className="mt-6 flex flex-col gap-4" role="status">
      <p>{children}</p>
      <Link href="/sign-in" className={primaryButtonClass}>
        Sign in
      </Link>
    </div>
  );
}
