"use client";

import { STAGE_WORDS } from "./run-format";

/** The progress of a queued or running run: stage in words and a labelled bar. */
export function RunProgress({ stage, progress, label = "Run progress" }: { stage: string; progress: number; label?: string }) {
  const percent = Math.round(progress * 100);
  return (
    <div className="flex flex-col gap-1" data-testid="run-progress">
      <div className="flex items-center justify-between text-sm">
        <span aria-live="polite">{STAGE_WORDS[stage] ?? stage}</span>
        <span className="figure text-ink-soft">{percent} %</span>
      </div>
      <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent} aria-valuetext={`${percent} %: ${STAGE_WORDS[stage] ?? stage}`} className="h-2 w-full overflow-hidden rounded-full bg-paper-sunk">
        <div className="h-full rounded-full bg-brass transition-[width]" style={{ width: `${percent}%` }} />
      </div>
    </div>
  );
}
