"use client";

import { useSyncExternalStore } from "react";

const noSubscription = () => () => {};

/**
 * False in the server's HTML and until React has hydrated the page, true after. A control whose work needs the page's
 * script (a file picked before hydration would be lost) stays disabled until then.
 */
export function useHydrated(): boolean {
  return useSyncExternalStore(
    noSubscription,
    () => true,
    () => false,
  );
}
