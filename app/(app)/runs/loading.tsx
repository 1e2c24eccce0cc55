import { PageLoading } from "@/app/_components/page-loading";

/** While every period's runs is read on the server. */
export default function Loading() {
  return <PageLoading what="Loading the runs…" />;
}
