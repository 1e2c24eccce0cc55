import { Logo } from "@/app/_components/logo";

/** The signed-out pages' frame: the logo and one card. */
export function AuthCard({ title, lead, children, wide = false }: { title: string; lead?: React.ReactNode; children: React.ReactNode; wide?: boolean }) {
  return (
    <main className="flex min-h-screen items-center justify-center px-4 py-12">
      <div className={`w-full ${wide ? "max-w-lg" : "max-w-sm"}`}>
        <div className="mb-8 flex justify-center">
          <Logo />
        </div>
        <div className="rounded-lg border border-ink-line bg-paper-raised p-6 shadow-sm">
          <h1 className="text-xl font-semibold">{title}</h1>
          {lead ? <div className="mt-1 text-sm text-ink-muted">{lead}</div> : null}
          {children}
        </div>
      </div>
    </main>
  );
}
