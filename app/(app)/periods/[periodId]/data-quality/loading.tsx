import { PageLoading } from "@/app/_components/page-loading";

/** While the data-quality report is read on the server. */
export default function Loading() {
  return <PageLoading what="Loading the data-quality report…" />;
}
