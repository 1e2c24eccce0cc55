import type { Dispatch, SetStateAction } from "react";
import { secondaryButtonClass } from "./field";

/**
 * "Page n of m" and the buttons to the page before and after, for a client component's paged list (the page in its
 * state); the list names the buttons (Previous and Next, or Newer and Older).
 */
export function Pager({
  page,
  pages,
  setPage,
  previous = "Previous",
  next = "Next",
  className = "flex items-center justify-between text-sm",
}: {
  page: number;
  pages: number;
  setPage: Dispatch<SetStateAction<number>>;
  previous?: string;
  next?: string;
  className?: string;
}) {
  return (
    <div className={className}>
      <span>
        Page {page} of {pages}
      </span>
      <div className="flex gap-2">
        <button type="button" className={secondaryButtonClass} disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
          {previous}
        </button>
        <button type="button" className={secondaryButtonClass} disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
          {next}
        </button>
      </div>
    </div>
  );
}
