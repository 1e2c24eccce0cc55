import type { Metadata } from "next";
import Link from "next/link";
import { DraftCaution } from "@/app/_components/draft-caution";
import { PageHeader } from "@/app/_components/page-header";
import { orNotFound, pageActor } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { today } from "@/lib/clock";
import { attestationText, fourEyesNote, packSource, periodFiling, type FilingDetail, type PeriodFiling } from "@/lib/data/filings";
import { packStates } from "@/lib/data/packs";
import { formatDate, formatTimestamp } from "@/reports/format";
import { filingSections, type Block } from "@/reports/sections";
import { contentHash } from "@/reports/view-model";
import { CoverNoteForm } from "./_components/cover-note-form";
import { ExplanationsForm } from "./_components/explanations-form";
import { MarkFiledForm } from "./_components/mark-filed-form";
import { NewVersionForm } from "./_components/new-version-form";
import { PrepareButton } from "./_components/prepare-button";
import { RequestChangesForm } from "./_components/request-changes-form";
import { SignDialog } from "./_components/sign-dialog";
import { SubmitForm } from "./_components/submit-form";
import { VerifyButton } from "./_components/verify-button";
import { FILING_STATE_LABELS, FilingStatus } from "./_components/filing-status";
import { SectionComments, type SectionComment } from "./_components/section-comments";
import { SectionTable } from "./_components/section-tables";
import { PackStatus } from "./_components/pack-status";
import { StaleRunNotice } from "../runs/_components/stale-run";

export const metadata: Metadata = { title: "Filing" };

/** Consecutive bullets as one list, everything else as it comes. */
function group(blocks: Block[]): (Block | { kind: "list"; items: string[] })[] {
  const out: (Block | { kind: "list"; items: string[] })[] = [];
  for (const b of blocks) {
    const last = out[out.length - 1];
    if (b.kind === "bullet") {
      if (last && last.kind === "list") last.items.push(b.text);
      else out.push({ kind: "list", items: [b.text] });
    } else out.push(b);
  }
  return out;
}

/** How a block of a section's text shows: its element and classes (a section's first heading labels the section, below). */
const TEXT_BLOCKS = {
  h2: { Tag: "h3", className: "mb-2 mt-5 font-semibold" },
  p: { Tag: "p", className: "my-2 whitespace-pre-wrap" },
  note: { Tag: "p", className: "my-3 border-l-2 border-ink-line pl-3 text-sm text-ink-soft" },
} as const;

function Card({ title, children, testId }: { title: string; children: React.ReactNode; testId?: string }) {
  return (
    <section className="rounded-lg border border-ink-line bg-paper-raised p-4" aria-label={title} data-testid={testId}>
      <h2 className="mb-3 text-sm font-semibold uppercase tracking-wide text-ink-muted">{title}</h2>
      {children}
    </section>
  );
}

function EmptyFiling({ data, canPrepare }: { data: PeriodFiling; canPrepare: boolean }) {
  return (
    <div className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6" data-testid="no-filing">
      <h2 className="font-semibold">No draft filing yet</h2>
      {data.markedRun ? (
        <>
          <p className="mt-1 max-w-2xl text-sm text-ink-soft">
            The run of {formatTimestamp(data.markedRun.startedAt)} by {data.markedRun.startedByName} is marked for this period&apos;s filing.{" "}
            {canPrepare ? "Assemble the draft from it: the figures, the method statement, the data-quality report and the firm's profile." : "The compliance officer assembles the draft from it."}
          </p>
          {canPrepare ? (
            <div className="mt-4">
              <PrepareButton periodId={data.period.id} rebuild={false} />
            </div>
          ) : null}
        </>
      ) : (
        <p className="mt-1 max-w-2xl text-sm text-ink-soft">
          No run is marked for this period&apos;s filing. The risk analyst completes a run and chooses &ldquo;use for the filing&rdquo; on it; the compliance officer then assembles the draft here.
        </p>
      )}
    </div>
  );
}

function People({ f, data }: { f: FilingDetail; data: PeriodFiling }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1.5 text-sm">
      <dt className="text-ink-muted">Version</dt>
      <dd data-testid="filing-version">{f.version}</dd>
      <dt className="text-ink-muted">Prepared by</dt>
      <dd>{f.preparedBy.name}</dd>
      <dt className="text-ink-muted">Submitted by</dt>
      <dd>{f.submittedBy?.name ?? "—"}</dd>
      <dt className="text-ink-muted">Run</dt>
      <dd>
        {f.content.engine.startedBy}, figures as of {formatDate(f.content.figures.asOf)}
      </dd>
      {f.filedAt ? (
        <>
          <dt className="text-ink-muted">Filed</dt>
          <dd data-testid="filed-line">
            {formatDate(f.filedAt)}, reference {f.filingReference}
          </dd>
        </>
      ) : null}
      {!f.runIsMarked && (f.status === "draft" || f.status === "changes_requested" || f.status === "in_review") ? (
        <dd className="col-span-2 mt-1 rounded-md border border-caution/30 bg-caution-bg px-2 py-1 text-caution">
          <span aria-hidden="true">◔ </span>
          {data.markedRun ? "The period's marked run has changed since this draft was assembled." : "The period no longer has a run marked for its filing."}
        </dd>
      ) : null}
    </dl>
  );
}

function Versions({ data }: { data: PeriodFiling }) {
  return (
    <ol className="flex flex-col gap-3 text-sm" data-testid="versions">
      {data.versions.map((v) => (
        <li key={v.id} className="rounded-md border border-ink-line/70 p-3" data-testid={`version-${v.version}`}>
          <div className="flex flex-wrap items-center justify-between gap-2">
            <span className="font-medium">Version {v.version}</span>
            <FilingStatus status={v.status} />
          </div>
          <p className="mt-1 text-xs text-ink-muted">
            {v.preparedBy.name}, {formatTimestamp(v.createdAt)}
          </p>
          {v.reason ? <p className="mt-1 text-ink-soft">Reason: {v.reason}</p> : null}
          <p className="mt-1 flex gap-3 text-xs">
            <a href={`/api/filings/${v.id}/packs/docx`} download className="underline" aria-label={`Word pack of version ${v.version}`}>
              Word
            </a>
            <a href={`/api/filings/${v.id}/packs/xlsx`} download className="underline" aria-label={`Spreadsheet pack of version ${v.version}`}>
              Spreadsheet
            </a>
          </p>
          {v.signatures.map((s) => (
            <div key={s.id} className={`mt-2 rounded border px-2 py-1.5 text-xs ${s.supersededAt ? "border-ink-line bg-paper-sunk text-ink-muted" : "border-ok/30 bg-ok-bg"}`} data-testid={s.supersededAt ? "superseded-signature" : "signature"}>
              <p>
                <span aria-hidden="true">{s.supersededAt ? "⊘ " : "✓ "}</span>
                <span className={s.supersededAt ? "line-through" : "font-medium"}>
                  Signed by {s.signerName} ({s.licenceReference}), {formatTimestamp(s.signedAt)}
                </span>
              </p>
              <p className="break-all font-mono">SHA-256 {s.contentHash}</p>
              {s.supersededAt ? (
                <p className="mt-1 font-medium text-ink-soft">
                  Superseded {formatTimestamp(s.supersededAt)}: {s.supersededReason}
                </p>
              ) : null}
            </div>
          ))}
        </li>
      ))}
    </ol>
  );
}

export default async function FilingPage({ params }: { params: Promise<{ periodId: string }> }) {
  const { periodId } = await params;
  const { actor } = await pageActor("periods.read");
  const data = await orNotFound(periodFiling(actor, periodId));
  const f = data.current;
  const officer = can(actor, "filing.prepare");
  const head = can(actor, "filing.review");
  const signer = can(actor, "filing.sign");
  const filer = can(actor, "filing.file");
  const editable = !!f && (f.status === "draft" || f.status === "changes_requested");
  const reviewing = !!f && (f.status === "in_review" || f.status === "changes_requested");

  const vm = f?.content ?? null;
  const sections = vm ? filingSections(vm).filter((s) => !s.appendix) : [];
  const commentsOf = (section: string): SectionComment[] =>
    (f?.comments ?? []).filter((c) => c.section === section).map((c) => ({ id: c.id, kind: c.kind, body: c.body, authorName: c.author.name, createdAt: c.createdAt }));
  const mode = (): "comment" | "reply" | null => {
    if (!f) return null;
    if (head && reviewing) return "comment";
    if (officer && (f.status === "changes_requested" || f.status === "in_review")) return "reply";
    return null;
  };
  const unexplained = f ? f.exceptions.filter((e) => !e.explanation).length : 0;
  const cannotSign = f && signer && f.status === "in_review" ? await fourEyesNote(actor, f.id) : null;
  const packs = f ? await packStates(await packSource(actor, f.id)) : [];

  return (
    <>
      <PageHeader
        title={`Filing · ${data.period.label}`}
        lead={
          <>
            Period ending {formatDate(data.period.periodEnd)} · deadline {formatDate(data.period.deadline)} ·{" "}
            <Link href={`/periods/${data.period.id}`} className="underline">
              back to the period
            </Link>
          </>
        }
        actions={f ? <FilingStatus status={f.status} /> : null}
      />
      <DraftCaution className="mb-6" />
      {data.markedRun && (!f || (f.runIsMarked && f.status !== "signed" && f.status !== "filed")) ? (
        <StaleRunNotice
          freshness={data.markedRun.freshness}
          what={f ? `The run this draft (version ${f.version}) was assembled from` : "The run marked for the filing"}
          advice="A draft is not assembled, submitted or signed from a stale run: the risk analyst starts a new run on the current inputs and chooses it for the filing; the draft is then rebuilt from it."
        />
      ) : null}
      {!f || !vm ? (
        <EmptyFiling data={data} canPrepare={officer} />
      ) : (
        <div className="grid grid-cols-1 gap-10 lg:grid-cols-[minmax(0,1fr)_22rem]">
          <article className="min-w-0 max-w-4xl text-[15px] leading-7 [overflow-wrap:break-word]" aria-label={`Filing, version ${f.version} (${FILING_STATE_LABELS[f.status].toLowerCase()})`}>
            {commentsOf("general").length || mode() ? (
              <SectionComments filingId={f.id} section="general" sectionTitle="The filing as a whole" comments={commentsOf("general")} mode={mode()} />
            ) : null}
            {sections.map((section) => (
              <section key={section.id} id={`section-${section.id}`} aria-labelledby={`heading-${section.id}`} className="border-b border-ink-line/70 py-8 first:pt-4 last:border-0" data-testid={`section-${section.id}`}>
                {group(section.blocks).map((b, i) => {
                  switch (b.kind) {
                    case "h1":
                      return (
                        <h2 key={i} id={`heading-${section.id}`} className="mb-3 text-xl font-semibold tracking-tight">
                          {b.text}
                        </h2>
                      );
                    case "h2":
                    case "p":
                    case "note": {
                      const { Tag, className } = TEXT_BLOCKS[b.kind];
                      return (
                        <Tag key={i} className={className}>
                          {b.text}
                        </Tag>
                      );
                    }
                    case "list":
                      return (
                        <ul key={i} className="my-2 list-disc space-y-1 pl-6">
                          {b.items.map((t, k) => (
                            <li key={k}>{t}</li>
                          ))}
                        </ul>
                      );
                    case "table":
                      return <SectionTable key={i} name={b.name} vm={vm} status={f.status} />;
                    default:
                      return null;
                  }
                })}
                {section.id === "cover" && editable && officer ? <CoverNoteForm filingId={f.id} coverNote={f.coverNote} /> : null}
                {section.id === "backtest" && editable && officer ? (
                  <ExplanationsForm filingId={f.id} exceptions={f.exceptions.map((e) => ({ date: e.date, label: formatDate(e.date), explanation: e.explanation }))} />
                ) : null}
                {section.id === "sign-off" ? <DraftCaution className="mt-4" /> : null}
                <SectionComments filingId={f.id} section={section.id} sectionTitle={section.title} comments={commentsOf(section.id)} mode={mode()} />
              </section>
            ))}
            <p className="mt-6 text-sm text-ink-soft">
              The positions, risk factors, correlation, contributions and VaR history are in the packs&apos; appendices.
            </p>
          </article>

          <aside className="flex min-w-0 flex-col gap-4 lg:self-start" aria-label="Filing state and actions">
            <Card title="State">
              <People f={f} data={data} />
            </Card>

            {officer && editable ? (
              <Card title={f.status === "changes_requested" ? "Answer and resubmit" : "Submit for review"} testId="officer-actions">
                {!f.runIsMarked && data.markedRun ? (
                  <div className="mb-4">
                    <PrepareButton periodId={data.period.id} rebuild />
                  </div>
                ) : null}
                <SubmitForm filingId={f.id} resubmit={f.status === "changes_requested"} unexplained={unexplained} />
              </Card>
            ) : null}

            {head && f.status === "in_review" ? (
              <Card title="Review and sign-off" testId="head-actions">
                <div className="flex flex-col gap-5">
                  {cannotSign ? (
                    <p role="note" className="rounded-md border border-caution/30 bg-caution-bg px-3 py-2 text-sm text-ink-soft" data-testid="four-eyes-note">
                      <span aria-hidden="true" className="text-caution">
                        ◔{" "}
                      </span>
                      {cannotSign}
                    </p>
                  ) : signer ? (
                    <SignDialog
                      filingId={f.id}
                      version={f.version}
                      signerName={actor.name}
                      licenceLabel={data.licenceLabel}
                      lastReference={data.lastLicenceReference}
                      attestation={attestationText()}
                      hashPreview={contentHash(vm)}
                    />
                  ) : null}
                  <details className="group">
                    <summary className="cursor-pointer text-sm font-medium underline">Request changes…</summary>
                    <div className="mt-3">
                      <RequestChangesForm filingId={f.id} />
                    </div>
                  </details>
                </div>
              </Card>
            ) : null}

            {head && !officer && editable ? (
              <Card title="Review and sign-off">
                <p className="text-sm text-ink-soft">{f.status === "changes_requested" ? "Changes were requested; the compliance officer answers and resubmits." : "The compliance officer has not submitted this draft yet."}</p>
              </Card>
            ) : null}

            {f.status === "signed" && (filer || officer) ? (
              <Card title="After signing" testId="after-signing">
                <div className="flex flex-col gap-5">
                  {filer ? <MarkFiledForm filingId={f.id} today={today()} /> : null}
                  {officer ? <NewVersionForm filingId={f.id} version={f.version} /> : null}
                </div>
              </Card>
            ) : null}

            <Card title="Filing packs">
              <div className="flex flex-col gap-2 text-sm">
                <a href={`/api/filings/${f.id}/packs/docx`} download className="font-medium underline" data-testid="download-docx">
                  Word pack (.docx), version {f.version}
                </a>
                <a href={`/api/filings/${f.id}/packs/xlsx`} download className="font-medium underline" data-testid="download-xlsx">
                  Spreadsheet pack (.xlsx), version {f.version}
                </a>
                <PackStatus states={packs} />
                <p className="text-xs text-ink-muted">{f.signature ? "Signed: the packs carry the sign-off block with the content hash." : "Marked DRAFT on every page until signed."} Downloads are recorded in the audit trail.</p>
              </div>
            </Card>

            <Card title="Signature">
              {f.signature ? (
                <p className="mb-3 text-sm">
                  <span aria-hidden="true">✓ </span>
                  Signed by {f.signature.signerName}, {formatTimestamp(f.signature.signedAt)}
                </p>
              ) : (
                <p className="text-sm text-ink-soft" data-testid="not-signed">
                  Not signed yet: there is no signature to verify.
                </p>
              )}
              {f.signature ? <VerifyButton filingId={f.id} /> : null}
            </Card>

            <Card title="Versions">
              <Versions data={data} />
            </Card>
          </aside>
        </div>
      )}
    </>
  );
}
