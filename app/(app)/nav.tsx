"use client";

import { useState } from "react";
import Link from "next/link";
import { usePathname } from "next/navigation";

export interface NavItem {
  href: string;
  label: string;
}

/**
 * The item the page belongs to: the one whose address is the longest prefix of the path, so that a period's filing
 * page marks "Filing" and not "Periods" as well.
 */
export function currentNavIndex(items: readonly NavItem[], pathname: string): number {
  let best = -1;
  items.forEach((item, i) => {
    const hit = pathname === item.href || pathname.startsWith(`${item.href}/`);
    if (hit && (best < 0 || item.href.length > items[best].href.length)) best = i;
  });
  return best;
}

/**
 * The month-end navigation; the current page is marked for screen readers and by weight, not colour alone. On a
 * narrow screen the items fold behind a "Menu" button and open as a list, so that nothing runs off the screen.
 */
export function Nav({ items }: { items: NavItem[] }) {
  const pathname = usePathname();
  const [open, setOpen] = useState(false);
  const [openedAt, setOpenedAt] = useState(pathname);
  // a new page closes the menu (state adjusted during render, not in an effect)
  if (openedAt !== pathname) {
    setOpenedAt(pathname);
    setOpen(false);
  }
  const current = currentNavIndex(items, pathname);
  const currentLabel = items[current]?.label;
  return (
    <nav aria-label="Month end" className="-mb-px">
      <button
        type="button"
        className="mb-2 inline-flex items-center gap-2 rounded-md border border-ink-line px-3 py-1.5 text-sm md:hidden"
        aria-expanded={open}
        aria-controls="month-end-links"
        onClick={() => setOpen((o) => !o)}
      >
        <span aria-hidden="true">{open ? "✕" : "☰"}</span> Menu{currentLabel ? <span className="text-ink-soft">: {currentLabel}</span> : null}
      </button>
      <ul id="month-end-links" className={`${open ? "flex" : "hidden"} flex-col pb-2 md:flex md:flex-row md:flex-wrap md:gap-1 md:pb-0`}>
        {items.map((item, i) => {
          const isCurrent = i === current;
          return (
            <li key={item.label}>
              <Link
                href={item.href}
                aria-current={isCurrent ? "page" : undefined}
                className={`block whitespace-nowrap border-l-2 px-3 py-2 text-sm md:border-b-2 md:border-l-0 ${
                  isCurrent ? "border-brass font-semibold text-ink" : "border-transparent text-ink-soft hover:border-ink-line hover:text-ink"
                }`}
              >
                {item.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
