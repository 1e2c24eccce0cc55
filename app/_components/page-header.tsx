/** The title block of a signed-in page; the lead may be text or its own block (a paragraph, a status line). */
export function PageHeader({ title, lead, actions }: { title: string; lead?: React.ReactNode; actions?: React.ReactNode }) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-ink-line pb-4">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">{title}</h1>
        {/* a div, not a p: a lead may hold its own paragraph (a <p> inside a <p> breaks hydration) */}
        {lead ? <div className="mt-1 max-w-3xl text-ink-soft">{lead}</div> : null}
      </div>
      {actions ? <div className="flex gap-2">{actions}</div> : null}
    </div>
  );
}
