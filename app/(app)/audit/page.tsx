import type { Metadata } from "next";
import { PageHeader } from "@/app/_components/page-header";
import { Forbidden } from "@/app/_components/forbidden";
import { QueryProvider } from "@/app/_components/query-provider";
import { pageActor } from "@/lib/auth/page";
import { AuditTable } from "./audit-table";

export const metadata: Metadata = { title: "Audit trail" };

export default async function AuditPage() {
  const { allowed } = await pageActor("audit.read");
  if (!allowed) return <Forbidden what="The audit trail is open to administrators and auditors." />;
  return (
    <>
      <PageHeader title="Audit trail" lead="Every change in the firm's Ballast record: who, when, what, on which record. Entries are permanent." />
      <QueryProvider>
        <AuditTable />
      </QueryProvider>
    </>
  );
}
