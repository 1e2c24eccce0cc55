import { PageLoading } from "@/app/_components/page-loading";

/** While the period is read on the server. */
export default function Loading() {
  return <PageLoading what="Loading the period…" />;
}
