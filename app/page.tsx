import Link from "next/link";
import { redirect } from "next/navigation";
import { Logo } from "./_components/logo";
import { getActor } from "@/lib/auth/actor";
import { isFirstRun } from "@/lib/data/accounts";

export const dynamic = "force-dynamic";

const cycle = [
  { title: "Data in, checked", text: "Month-end positions and price history are validated row by row and previewed; nothing enters a period until someone confirms it." },
  { title: "A stated method", text: "The risk analyst records which volatility estimator is used for which asset class, why, and what it cannot do, with evidence from the firm's own history." },
  { title: "Reproducible runs", text: "Each run stores the hashes of its inputs and the engine version, so any past figure can be recomputed and shown to an examiner." },
  { title: "Four-eyes sign-off", text: "The compliance head reviews and signs a draft they did not prepare; the signature covers a hash of exactly what was signed." },
];

export default async function LandingPage() {
  if (await getActor()) redirect("/home");
  // an empty install starts with its first-run screen
  if (await isFirstRun()) redirect("/setup");
  return (
    <main className="mx-auto flex min-h-screen max-w-5xl flex-col px-6 py-10">
      <header className="flex items-center justify-between">
        <Logo />
        <Link href="/sign-in" className="rounded-md bg-ink px-4 py-2 font-medium text-paper hover:bg-ink-soft">
          Sign in
        </Link>
      </header>
      <section className="mt-20 max-w-3xl">
        <h1 className="text-4xl font-semibold leading-tight tracking-tight sm:text-5xl">
          Month-end market risk and capital, kept steady.
        </h1>
        <p className="mt-6 text-lg text-ink-soft">
          Ballast holds a small broker&apos;s month end in one place: positions and price history come in, volatility is
          estimated by a documented method (moving average, EWMA, ARCH, GARCH(1,1)), and value-at-risk, expected
          shortfall, a backtest and a capital figure go into a draft filing pack that the firm&apos;s licensed compliance
          officer reviews and signs. Every figure is a draft under the firm&apos;s own rules.
        </p>
      </section>
      <section aria-label="How a month end runs" className="mt-16 grid gap-6 sm:grid-cols-2">
        {cycle.map((step, i) => (
          <div key={step.title} className="rounded-lg border border-ink-line bg-paper-raised p-6">
            <p className="text-sm font-medium text-brass">Step {i + 1}</p>
            <h2 className="mt-1 text-lg font-semibold">{step.title}</h2>
            <p className="mt-2 text-ink-soft">{step.text}</p>
          </div>
        ))}
      </section>
      <footer className="mt-auto pt-16 text-sm text-ink-muted">
        Ballast produces drafts for review and sign-off by the firm&apos;s licensed compliance officer. Local rules and the
        regulator&apos;s current requirements govern.
      </footer>
    </main>
  );
}
