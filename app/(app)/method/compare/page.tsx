import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { inputClass, secondaryButtonClass } from "@/app/_components/field";
import { orNotFound, pageActor } from "@/lib/auth/page";
import { diffMethodVersions, listMethodVersions } from "@/lib/data/method";
import { methodDiffQuerySchema } from "@/lib/validation/method";
import { VersionStatus } from "../_components/version-status";
import { WORD_ROW, WORD_TABLE } from "../_components/method-view";
import { FigureRow, FigureTable } from "@/app/_components/figure-table";
import { Panel } from "@/app/_components/panel";

export const metadata: Metadata = { title: "Compare method statement versions" };

const STATUS_WORD = { draft: "draft", approved: "approved", superseded: "superseded", discarded: "discarded" } as const;

export default async function CompareMethodPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { actor } = await pageActor();
  const raw = await searchParams;
  const parsed = methodDiffQuerySchema.safeParse({ from: typeof raw.from === "string" && raw.from ? raw.from : undefined, to: typeof raw.to === "string" && raw.to ? raw.to : undefined });
  const query = parsed.success ? parsed.data : {};
  const versions = await listMethodVersions(actor);
  const diff = await orNotFound(diffMethodVersions(actor, query.from, query.to));
  const options = versions.map((v) => (
    <option key={v.id} value={v.id}>
      Version {v.version} ({STATUS_WORD[v.status]})
    </option>
  ));
  return (
    <>
      <PageHeader title="Compare method statement versions" lead="Field by field: what changed in the method, the rationale and the limitations between two versions." actions={<Link href="/method" className="text-sm font-medium underline">All versions</Link>} />
      <form method="get" className="mb-6 flex flex-wrap items-end gap-4 rounded-lg border border-ink-line bg-paper-raised p-4">
        <div className="flex flex-col gap-1">
          <label htmlFor="from" className="text-sm font-medium">
            From
          </label>
          <select id="from" name="from" defaultValue={diff?.from?.id ?? ""} className={inputClass}>
            <option value="">The version it was drawn from</option>
            {options}
          </select>
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor="to" className="text-sm font-medium">
            To
          </label>
          <select id="to" name="to" defaultValue={diff?.to.id ?? ""} className={inputClass}>
            {options}
          </select>
        </div>
        <button type="submit" className={secondaryButtonClass}>
          Compare
        </button>
      </form>
      {!diff ? (
        <p className="text-sm text-ink-soft">No versions yet.</p>
      ) : !diff.from ? (
        <p className="text-sm text-ink-soft">Version {diff.to.version} is the first version: there is nothing earlier to compare it with. Choose two versions above.</p>
      ) : (
        <div className="flex flex-col gap-6">
          <p className="flex flex-wrap items-center gap-2 text-sm">
            From <strong>version {diff.from.version}</strong> <VersionStatus status={diff.from.status} awaitingCoApproval={false} /> to <strong>version {diff.to.version}</strong>{" "}
            <VersionStatus status={diff.to.status} awaitingCoApproval={false} />
            {diff.to.reason ? <span className="text-ink-soft">· reason for version {diff.to.version}: {diff.to.reason}</span> : null}
          </p>
          <Panel id="diff-content" title="Method" padding="p-5" headingClassName="mb-3 text-lg font-semibold">
            {diff.content.length === 0 ? (
              <p className="text-sm text-ink-soft">No field of the method differs.</p>
            ) : (
              <FigureTable caption="Fields that differ" hiddenCaption words {...WORD_TABLE} columns={["Field", `Version ${diff.from.version}`, `Version ${diff.to.version}`]}>
                {diff.content.map((c) => (
                  <FigureRow
                    key={c.path}
                    {...WORD_ROW}
                    head={c.label}
                    cells={[
                      c.from === null ? <span className="text-ink-muted">not set</span> : <del className="decoration-alert/60">{c.from}</del>,
                      c.to === null ? <span className="text-ink-muted">not set</span> : <ins className="no-underline font-medium">{c.to}</ins>,
                    ]}
                  />
                ))}
              </FigureTable>
            )}
          </Panel>
          <Panel id="diff-rationale" title="Rationale" padding="p-5" headingClassName="mb-3 text-lg font-semibold">
            {diff.rationale.changed ? (
              <div className="grid gap-4 text-sm md:grid-cols-2">
                <div>
                  <h3 className="mb-1 font-medium text-ink-soft">Version {diff.from.version}</h3>
                  <p className="whitespace-pre-line rounded-md bg-paper-sunk p-3">{diff.rationale.from}</p>
                </div>
                <div>
                  <h3 className="mb-1 font-medium text-ink-soft">Version {diff.to.version}</h3>
                  <p className="whitespace-pre-line rounded-md border border-brass/30 bg-brass-light/40 p-3">{diff.rationale.to}</p>
                </div>
              </div>
            ) : (
              <p className="text-sm text-ink-soft">Unchanged.</p>
            )}
          </Panel>
          <Panel id="diff-limitations" title="Limitations" padding="p-5" headingClassName="mb-3 text-lg font-semibold">
            {diff.limitations.added.length === 0 && diff.limitations.removed.length === 0 ? (
              <p className="text-sm text-ink-soft">Unchanged ({diff.limitations.kept}).</p>
            ) : (
              <ul className="space-y-2 text-sm">
                {diff.limitations.added.map((t) => (
                  <li key={`+${t}`} className="flex gap-2">
                    <span className="shrink-0 font-medium text-ok">＋ Added</span>
                    <span>{t}</span>
                  </li>
                ))}
                {diff.limitations.removed.map((t) => (
                  <li key={`-${t}`} className="flex gap-2">
                    <span className="shrink-0 font-medium text-alert">− Removed</span>
                    <span>{t}</span>
                  </li>
                ))}
                <li className="text-ink-muted">{diff.limitations.kept} unchanged.</li>
              </ul>
            )}
          </Panel>
          <p className="text-sm text-ink-soft">
            Evidence: version {diff.from.version} {diff.evidence.from ? `computed ${diff.evidence.from.slice(0, 10)}` : "has none"}; version {diff.to.version}{" "}
            {diff.evidence.to ? `computed ${diff.evidence.to.slice(0, 10)}` : "has none yet"}.
          </p>
        </div>
      )}
    </>
  );
}
