import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { FigureTable } from "@/app/_components/figure-table";
import { formatTimestamp } from "@/app/_components/format";
import { pageActor } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { coApprovalRequired, currentMethod, listMethodVersions } from "@/lib/data/method";
import { ApprovalLine, MethodView } from "./_components/method-view";
import { VersionStatus } from "./_components/version-status";
import { NewVersionButton } from "./new-version-button";

export const metadata: Metadata = { title: "Method statement" };

export default async function MethodPage() {
  const { actor } = await pageActor();
  const [current, versions, coApproval] = await Promise.all([currentMethod(actor), listMethodVersions(actor), coApprovalRequired(actor)]);
  const draft = versions.find((v) => v.status === "draft");
  const canEdit = can(actor, "method.edit");
  return (
    <>
      <PageHeader
        title="Method statement"
        lead={
          <>
            How Ballast estimates risk for {actor.firmName}: the volatility estimator per asset class, covariance, VaR method and windows, with the reasons, the limitations and
            the evidence from the firm&apos;s own history. Runs use the approved version.
            {coApproval ? " A compliance head co-approves each version." : ""}
          </>
        }
        actions={
          draft ? (
            <Link href={`/method/${draft.id}`} className="inline-flex items-center rounded-md border border-ink-line bg-paper-raised px-4 py-2 font-medium hover:bg-paper-sunk">
              {draft.awaitingCoApproval ? `Version ${draft.version} awaits co-approval` : `Open draft version ${draft.version}`}
            </Link>
          ) : canEdit ? (
            <NewVersionButton currentVersion={current?.version ?? null} />
          ) : null
        }
      />
      {current ? (
        <div className="flex flex-col gap-4">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 className="text-xl font-semibold">Approved version {current.version}</h2>
            <ApprovalLine version={current} />
          </div>
          <MethodView version={current} />
        </div>
      ) : (
        <div className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6">
          <h2 className="font-semibold">No approved method statement yet</h2>
          <p className="mt-1 text-sm text-ink-soft">
            Runs need an approved version. {canEdit ? "Start one from the defaults, attach the evidence, and approve it." : "The risk analyst writes and approves it."}
          </p>
        </div>
      )}
      <section aria-labelledby="history" className="mt-8">
        <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
          <h2 id="history" className="text-lg font-semibold">
            Version history
          </h2>
          {versions.length > 1 ? (
            <Link href="/method/compare" className="text-sm font-medium underline">
              Compare two versions
            </Link>
          ) : null}
        </div>
        {versions.length === 0 ? (
          <p className="text-sm text-ink-soft">No versions yet.</p>
        ) : (
          <div className="relative overflow-x-auto" tabIndex={0} role="region" aria-label="Method statement versions">
          <FigureTable
            className="w-full rounded-lg border border-ink-line bg-paper-raised text-sm"
            caption="Method statement versions, newest first"
            hiddenCaption
            words
            pad="px-4 py-2"
            gap=""
            bodyClassName=""
            columns={["Version", "Status", "Drafted", "Approved", "Reason for the change", <span key="links" className="sr-only">Links</span>]}
          >
            {versions.map((v) => (
              <tr key={v.id} className="border-b border-ink-line/60 last:border-0" data-testid={`version-${v.version}`}>
                <td className="px-4 py-2 font-medium">
                  <Link href={`/method/${v.id}`} className="hover:underline">
                    Version {v.version}
                  </Link>
                </td>
                <td className="px-4 py-2">
                  <VersionStatus status={v.status} awaitingCoApproval={v.awaitingCoApproval} />
                </td>
                <td className="px-4 py-2 text-ink-soft">
                  {v.createdBy.name}, {formatTimestamp(v.createdAt)}
                </td>
                <td className="px-4 py-2 text-ink-soft">
                  {v.approvedBy ? v.approvedBy.name : "—"}
                  {v.coApprovedBy ? ` with ${v.coApprovedBy.name}` : ""}
                  {v.approvedAt ? `, ${formatTimestamp(v.approvedAt)}` : ""}
                </td>
                <td className="max-w-md px-4 py-2 text-ink-soft">{v.reason || "—"}</td>
                <td className="px-4 py-2 text-right">
                  {versions.some((o) => o.version < v.version) ? (
                    <Link href={`/method/compare?to=${v.id}`} className="underline">
                      Changes
                    </Link>
                  ) : null}
                </td>
              </tr>
            ))}
          </FigureTable>
          </div>
        )}
      </section>
    </>
  );
}
