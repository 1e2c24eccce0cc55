import type { ReactNode } from "react";

/** A column heading of a SimpleTable: its text, or the text with right alignment (figures). */
export type SimpleColumn = ReactNode | { label: ReactNode; align: "right" };

const isAligned = (c: SimpleColumn): c is { label: ReactNode; align: "right" } => typeof c === "object" && c !== null && "align" in c;

/**
 * A static table in the app's boxed style: the scrolling frame, a screen-reader caption (or a heading it is labelled by),
 * one header row of column headings, and the body rows the page writes as children. For sortable, data-driven tables use DataTable.
 */
export function SimpleTable({
  caption,
  labelledBy,
  testId,
  columns,
  padding = "px-3 py-2",
  children,
}: {
  caption?: string;
  labelledBy?: string;
  testId?: string;
  columns: SimpleColumn[];
  /** The heading cells' padding (the body rows set their own to match). */
  padding?: "px-3 py-2" | "px-4 py-2";
  children: ReactNode;
}) {
  return (
    <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
      <table className="w-full text-sm" aria-labelledby={labelledBy} data-testid={testId}>
        {caption ? <caption className="sr-only">{caption}</caption> : null}
        <thead className="bg-paper-sunk text-left text-ink-soft">
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
