import type { ReactNode } from "react";
import { primaryButtonClass } from "@/app/_components/field";

/** What a settings form says after a save: done (green) or refused (red); nothing before the first. */
export type SaveStatus = { tone: "ok" | "alert"; text: string } | null;

/** The status of a save that threw: the server's message, else a plain "Could not save." */
export function saveFailed(error: unknown): SaveStatus {
  return { tone: "alert", text: error instanceof Error ? error.message : "Could not save." };
}

/** The line beside a settings form's save button, announced to screen readers; nothing while there is no status. */
export function SaveStatusLine({ status }: { status: SaveStatus }) {
  return status ? (
    <p role="status" className={`text-sm ${status.tone === "ok" ? "text-ok" : "text-alert"}`}>
      {status.text}
    </p>
  ) : null;
}

/** A settings form's save button: its label, "Saving…" while the save is under way. */
export function SaveButton({ busy, disabled = busy, children }: { busy: boolean; disabled?: boolean; children: ReactNode }) {
  return (
    <button type="submit" className={primaryButtonClass} disabled={disabled}>
      {busy ? "Saving…" : children}
    </button>
  );
}
