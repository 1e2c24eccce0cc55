import { PageLoading } from "@/app/_components/page-loading";

/** While the data page is read on the server. */
export default function Loading() {
  return <PageLoading what="Loading the uploads…" />;
}
