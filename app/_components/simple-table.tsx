import type { ReactNode } from "react";

/** A column heading of a SimpleTable: its text, or the text with right alignment (figures). */
export type SimpleColumn = ReactNode | { label: ReactNode; align: "right" };

const isAligned = (c: SimpleColumn): c is { label: ReactNode; align: "right" } => typeof c === "object" && c !== null && "align" in c;

/**
 * A static table in the app's boxed style: the scrolling frame, a screen-reader caption (or a heading it is labelled by),
 * one header row of column headings, and the body rows the page writes as children. With `scroll`, a long table scrolls
 * in a frame of that height under a sticky header, and the frame is a labelled region that takes keyboard focus.
 * For sortable, data-driven tables use DataTable.
 */
export function SimpleTable({
  caption,
  labelledBy,
  testId,
  columns,
  padding = "px-3 py-2",
  scroll,
  children,
}: {
  caption?: string;
  labelledBy?: string;
  testId?: string;
  columns: SimpleColumn[];
  /** The heading cells' padding (the body rows set their own to match). */
  padding?: "px-3 py-2" | "px-4 py-2";
  /** scroll inside a frame of this height, the frame named by `label` */
  scroll?: { label: string; maxHeight: "max-h-80" | "max-h-96" };
  children: ReactNode;
}) {
  const frame = scroll ? { className: `${scroll.maxHeight} overflow-auto rounded-lg border border-ink-line bg-paper-raised`, tabIndex: 0, role: "region", "aria-label": scroll.label } : { className: "relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised" };
  return (
    <div {...frame}>
      <table className="w-full text-sm" aria-labelledby={labelledBy} data-testid={testId}>
        {caption ? <caption className="sr-only">{caption}</caption> : null}
        <thead className={scroll ? "sticky top-0 bg-paper-sunk text-left text-ink-soft" : "bg-paper-sunk text-left text-ink-soft"}>
          <tr>
            {columns.map((c, i) => (
              <th key={i} scope="col" className={isAligned(c) ? `${padding} text-right font-medium` : `${padding} font-medium`}>
                {isAligned(c) ? c.label : c}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}
