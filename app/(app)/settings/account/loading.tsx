import { PageLoading } from "@/app/_components/page-loading";

/** While your account is read on the server. */
export default function Loading() {
  return <PageLoading what="Loading your account…" />;
}
