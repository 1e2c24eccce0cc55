"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

const TABS = [
  { href: "", label: "Summary" },
  { href: "/capital", label: "Capital" },
  { href: "/factors", label: "Risk factors" },
  { href: "/contributions", label: "Contributions" },
  { href: "/volatility", label: "Volatility" },
  { href: "/backtest", label: "Backtest" },
  { href: "/change", label: "Change since last period" },
];

/** The pages of one run; the current one marked for screen readers and by weight. */
export function RunTabs({ base }: { base: string }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Run pages" className="mb-6 flex gap-1 overflow-x-auto border-b border-ink-line">
      {TABS.map((t) => {
        const href = `${base}${t.href}`;
        const current = pathname === href;
        return (
          <Link
            key={t.label}
            href={href}
            aria-current={current ? "page" : undefined}
            className={`-mb-px whitespace-nowrap border-b-2 px-3 py-2 text-sm ${current ? "border-brass font-semibold text-ink" : "border-transparent text-ink-soft hover:border-ink-line hover:text-ink"}`}
          >
            {t.label}
          </Link>
        );
      })}
    </nav>
  );
}
