import { PageLoading } from "@/app/_components/page-loading";

/** While the reporting periods is read on the server. */
export default function Loading() {
  return <PageLoading what="Loading the reporting periods…" />;
}
