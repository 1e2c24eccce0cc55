import type { ReactNode } from "react";

/**
 * A column heading of a FigureTable: its text (right-aligned, as figures are), or `{ label, align: "left" }` for a
 * column of words. The first `leftColumns` headings (one by default) are left-aligned either way.
 */
export type FigureColumn = ReactNode | { label: ReactNode; align: "left" | "right" };

const isAligned = (c: FigureColumn): c is { label: ReactNode; align: "left" | "right" } => typeof c === "object" && c !== null && "align" in c && "label" in c;

/** The cells' spacing: every cell's vertical padding, the gap after each column, and whether the last column keeps that gap (otherwise it ends flush). */
type Spacing = { pad?: string; gap?: string; padLast?: boolean };

/** A cell's padding at column `i` of `count`. */
const cellPad = ({ pad = "py-1.5", gap = "pr-2", padLast = false }: Spacing, i: number, count: number) => (gap && (i < count - 1 || padLast) ? `${pad} ${gap}` : pad);

/**
 * A table of figures as the run and method pages show them: a caption (shown small above the table, or only to
 * screen readers), one header row with a rule beneath it (the first column names the row, the others are figures,
 * right-aligned), and the body rows as children (FigureRow, or the page's own rows). The body is in tabular numerals
 * unless `bodyClassName` says otherwise. With `words`, a table of words: every heading left-aligned unless marked
 * `{ label, align: "right" }`.
 */
export function FigureTable({
  caption,
  hiddenCaption = false,
  columns,
  words = false,
  leftColumns = 1,
  className = "w-full text-sm",
  testId,
  headClassName,
  bodyClassName = "figure",
  pad,
  gap,
  padLast,
  children,
}: Spacing & {
  caption?: ReactNode;
  hiddenCaption?: boolean;
  columns: FigureColumn[];
  words?: boolean;
  leftColumns?: number;
  /** The table element's classes (width, text size, margin). */
  className?: string;
  testId?: string;
  /** The header's classes (e.g. sticky in a scrolling box). */
  headClassName?: string;
  bodyClassName?: string;
  children: ReactNode;
}) {
  const spacing = { pad, gap, padLast };
  return (
    <table className={className} data-testid={testId}>
      {caption ? <caption className={hiddenCaption ? "sr-only" : "mb-1 text-left text-xs text-ink-muted"}>{caption}</caption> : null}
      <thead className={headClassName}>
        <tr className={`border-b border-ink-line ${words ? "text-left" : "text-right"} text-ink-muted`}>
          {columns.map((c, i) => {
            // the row's alignment is the rule; a heading says only where it differs
            const align = words ? (isAligned(c) && c.align === "right" ? "text-right " : "") : (isAligned(c) ? c.align === "left" : i < leftColumns) ? "text-left " : "";
            return (
              <th key={i} scope="col" className={`${cellPad(spacing, i, columns.length)} ${align}font-medium`}>
                {isAligned(c) ? c.label : c}
              </th>
            );
          })}
        </tr>
      </thead>
      <tbody className={bodyClassName || undefined}>{children}</tbody>
    </table>
  );
}

/**
 * A body row of a FigureTable: its heading cell (what the row is) and its figures, with a faint rule beneath it unless
 * `className` says otherwise; give it the table's spacing where that is not the default.
 */
export function FigureRow({
  head,
  cells,
  className = "border-b border-ink-line/60 text-right",
  headClassName = "text-left font-normal",
  ...spacing
}: Spacing & {
  head: ReactNode;
  cells: ReactNode[];
  className?: string;
  headClassName?: string;
}) {
  const count = cells.length + 1;
  return (
    <tr className={className}>
      <th scope="row" className={`${cellPad(spacing, 0, count)} ${headClassName}`}>
        {head}
      </th>
      {cells.map((cell, i) => (
        <td key={i} className={cellPad(spacing, i + 1, count)}>
          {cell}
        </td>
      ))}
    </tr>
  );
}
