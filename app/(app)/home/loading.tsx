import { PageLoading } from "@/app/_components/page-loading";

/** While this month is read on the server. */
export default function Loading() {
  return <PageLoading what="Loading this month…" />;
}
