/** A status that always carries a word and an icon, never colour alone. */
type Tone = "ok" | "caution" | "alert" | "neutral";

const tones: Record<Tone, { className: string; icon: string }> = {
  ok: { className: "bg-ok-bg text-ok border-ok/30", icon: "✓" },
  caution: { className: "bg-caution-bg text-caution border-caution/30", icon: "◔" },
  alert: { className: "bg-alert-bg text-alert border-alert/30", icon: "!" },
  neutral: { className: "bg-paper-sunk text-ink-soft border-ink-line", icon: "•" },
};

export function StatusBadge({ tone, children }: { tone: Tone; children: React.ReactNode }) {
  const t = tones[tone];
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-medium ${t.className}`}>
      <span aria-hidden="true">{t.icon}</span>
      {children}
    </span>
  );
}
