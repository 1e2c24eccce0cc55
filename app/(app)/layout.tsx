import Link from "next/link";
import { redirect } from "next/navigation";
import { Logo } from "@/app/_components/logo";
import { getActor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { currentFilingPeriodId } from "@/lib/data/filings";
import { signOutAction, switchFirmAction } from "./actions";
import { Nav, type NavItem } from "./nav";

/** The signed-in shell: firm, person, month-end navigation, sign-out. It shows; the gate in each page guards. */
export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const actor = await getActor();
  if (!actor) redirect("/sign-in");
  const filingPeriodId = await currentFilingPeriodId(actor);
  const items: NavItem[] = [
    { href: "/home", label: "This month" },
    { href: "/data", label: "Data" },
    { href: "/periods", label: "Periods" },
    { href: "/runs", label: "Runs" },
    { href: filingPeriodId ? `/periods/${filingPeriodId}/filing` : "/periods", label: "Filing" },
    { href: "/method", label: "Method" },
    { href: "/calendar", label: "Calendar" },
    { href: "/settings", label: "Settings" },
  ];
  if (can(actor, "audit.read")) items.push({ href: "/audit", label: "Audit trail" });

  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-paper-raised focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="border-b border-ink-line bg-paper-raised">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center justify-between gap-3 px-4 pt-3 sm:px-6">
          <div className="flex items-center gap-4">
            <Link href="/home" aria-label="Ballast home">
              <Logo />
            </Link>
            {actor.firms.length > 1 ? (
              <form action={switchFirmAction} className="flex items-center gap-2">
                <label htmlFor="firm-switch" className="sr-only">
                  Firm
                </label>
                <select id="firm-switch" name="firmId" defaultValue={actor.firmId} className="rounded-md border border-ink-line bg-paper px-2 py-1 text-sm">
                  {actor.firms.map((f) => (
                    <option key={f.id} value={f.id}>
                      {f.name}
                    </option>
                  ))}
                </select>
                <button type="submit" className="text-sm underline">
                  Switch
                </button>
              </form>
            ) : (
              <span className="text-sm font-medium text-ink-soft" data-testid="firm-name">
                {actor.firmName}
              </span>
            )}
          </div>
          <div className="flex items-center gap-3 text-sm">
            <div className="text-right">
              <p className="font-medium" data-testid="user-name">
                {actor.name}
              </p>
              <p className="text-xs text-ink-muted" data-testid="user-roles">
                {actor.roles.map((r) => ROLE_LABELS[r]).join(" · ")}
              </p>
            </div>
            <form action={signOutAction}>
              <button type="submit" className="rounded-md border border-ink-line px-3 py-1.5 hover:bg-paper-sunk">
                Sign out
              </button>
            </form>
          </div>
        </div>
        <div className="mx-auto mt-2 max-w-7xl px-4 sm:px-6">
          <Nav items={items} />
        </div>
      </header>
      <main id="main" className="mx-auto max-w-7xl px-4 py-8 sm:px-6">
        {children}
      </main>
    </div>
  );
}
