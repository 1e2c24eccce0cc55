import type { ReactNode } from "react";

/**
 * A titled card of the signed-in pages: a section on the raised paper, labelled by its heading. `level` is the
 * heading's rank in the page; `className` adds the card's own layout (grid, flex, gaps); the heading's classes
 * and the padding may differ from page to page.
 */
export function Panel({
  id,
  title,
  level = 2,
  className = "",
  padding = "p-4",
  headingClassName = "font-semibold",
  testId,
  children,
}: {
  id: string;
  title: ReactNode;
  level?: 2 | 3 | 4;
  className?: string;
  padding?: "p-4" | "p-5";
  headingClassName?: string;
  testId?: string;
  children: ReactNode;
}) {
  const Heading = `h${level}` as const;
  return (
    <section aria-labelledby={id} className={`${className ? `${className} ` : ""}rounded-lg border border-ink-line bg-paper-raised ${padding}`} data-testid={testId}>
      <Heading id={id} className={headingClassName}>
        {title}
      </Heading>
      {children}
    </section>
  );
}
