import { notFound } from "next/navigation";
import { pageActor } from "@/lib/auth/page";
import { periodExists } from "@/lib/data/periods";

/**
 * Every page of a period: another firm's period (or none) is a real 404, decided here before anything streams (a
 * page under a loading boundary, such as the filing, would otherwise answer 200 with the not-found text).
 */
export default async function PeriodLayout({ children, params }: { children: React.ReactNode; params: Promise<{ periodId: string }> }) {
  const { periodId } = await params;
  const { actor } = await pageActor();
  if (!(await periodExists(actor, periodId))) notFound();
  return <>{children}</>;
}
