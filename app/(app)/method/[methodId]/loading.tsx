import { PageLoading } from "@/app/_components/page-loading";

/** While the method statement version is read on the server. */
export default function Loading() {
  return <PageLoading what="Loading the method statement version…" />;
}
