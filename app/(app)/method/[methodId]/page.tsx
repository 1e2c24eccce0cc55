import type { Metadata } from "next";
import Link from "next/link";
import { PageHeader } from "@/app/_components/page-header";
import { orNotFound, pageActor } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { coApprovalRequired, getMethodVersion } from "@/lib/data/method";
import { ApprovalLine, MethodView } from "../_components/method-view";
import { DraftEditor } from "./draft-editor";
import { ApprovalPanel } from "./approval-panel";

export const metadata: Metadata = { title: "Method statement version" };

export default async function MethodVersionPage({ params }: { params: Promise<{ methodId: string }> }) {
  const { methodId } = await params;
  const { actor } = await pageActor();
  const version = await orNotFound(getMethodVersion(actor, methodId));
  const coApproval = await coApprovalRequired(actor);
  const isDraft = version.status === "draft";
  const canEdit = isDraft && can(actor, "method.edit");
  const canCoApprove =
    isDraft && coApproval && version.awaitingCoApproval && actor.roles.includes("compliance_head") && actor.userId !== version.approvedBy?.id && actor.userId !== version.createdBy.id;
  const title = isDraft ? `Method statement · draft version ${version.version}` : `Method statement · version ${version.version}`;
  return (
    <>
      <PageHeader
        title={title}
        lead={<ApprovalLine version={version} />}
        actions={
          <div className="flex gap-4 text-sm">
            {version.previousId ? (
              <Link href={`/method/compare?from=${version.previousId}&to=${version.id}`} className="font-medium underline">
                Changes from version {version.previousVersion}
              </Link>
            ) : null}
            <Link href="/method" className="font-medium underline">
              All versions
            </Link>
          </div>
        }
      />
      {canEdit ? (
        <>
          {version.reason ? (
            <p className="mb-4 text-sm">
              <span className="font-medium">Why this version: </span>
              {version.reason}
            </p>
          ) : null}
          <DraftEditor version={version} coApprovalRequired={coApproval} canApprove={can(actor, "method.approve")} />
        </>
      ) : (
        <div className="flex flex-col gap-6">
          {isDraft ? (
            <p role="note" className="rounded-md border border-caution/30 bg-caution-bg px-3 py-2 text-sm">
              This is a draft: runs use the approved version until this one is approved.
            </p>
          ) : version.status !== "approved" ? (
            <p role="note" className="rounded-md border border-ink-line bg-paper-sunk px-3 py-2 text-sm">
              This version is {version.status}; it stays on record unchanged, with any runs that used it.
            </p>
          ) : null}
          <MethodView version={version} />
          {isDraft ? <ApprovalPanel version={version} coApprovalRequired={coApproval} canApprove={false} canCoApprove={canCoApprove} /> : null}
        </div>
      )}
    </>
  );
}
