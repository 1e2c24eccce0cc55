"use client";

import { useCallback, useEffect, useState } from "react";
import { apiFetch } from "@/app/_components/api";
import { secondaryButtonClass } from "@/app/_components/field";
import { formatTimestamp } from "@/app/_components/format";
import type { InboxMessage } from "@/lib/mail/inbox";

/** The listener's messages for this firm, read through GET /api/mail/messages; newest first. */
export function MailInbox() {
  const [messages, setMessages] = useState<InboxMessage[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [open, setOpen] = useState<number | null>(null);

  const load = useCallback(async () => {
    setError(null);
    try {
      setMessages((await apiFetch<{ messages: InboxMessage[] }>("/api/mail/messages")).messages);
    } catch (e) {
      setError(e instanceof Error ? e.message : "Could not read the listener.");
    }
  }, []);

  useEffect(() => {
    // Fetch once on mount; the Refresh button reloads.
    // eslint-disable-next-line react-hooks/set-state-in-effect
    void load();
  }, [load]);

  return (
    <div className="flex flex-col gap-3">
      <div className="flex items-center gap-3">
        <button type="button" className={secondaryButtonClass} onClick={load}>
          Refresh
        </button>
        <p role="status" className="text-sm text-ink-soft">
          {messages === null && !error ? "Reading…" : messages ? `${messages.length} message${messages.length === 1 ? "" : "s"}` : ""}
        </p>
      </div>
      {error ? (
        <p role="alert" className="rounded-md border border-alert/30 bg-alert-bg px-3 py-2 text-sm text-alert">
          <span aria-hidden="true">! </span>
          {error}
        </p>
      ) : null}
      {messages && messages.length === 0 ? <p className="rounded-lg border border-dashed border-ink-line bg-paper-raised p-6 text-ink-soft">Nothing received yet.</p> : null}
      {messages && messages.length > 0 ? (
        <ul className="divide-y divide-ink-line rounded-lg border border-ink-line bg-paper-raised" data-testid="mail-list">
          {messages.map((m) => (
            <li key={m.id} data-testid="mail-item">
              <button type="button" className="flex w-full flex-wrap items-baseline justify-between gap-2 px-4 py-3 text-left hover:bg-paper-sunk" aria-expanded={open === m.id} onClick={() => setOpen(open === m.id ? null : m.id)}>
                <span>
                  <span className="block font-medium">{m.subject}</span>
                  <span className="block text-xs text-ink-muted" data-testid="mail-to">
                    To {m.to.join(", ")}
                  </span>
                </span>
                <span className="text-xs text-ink-muted">{formatTimestamp(m.receivedAt)}</span>
              </button>
              {open === m.id ? <pre className="whitespace-pre-wrap border-t border-ink-line bg-paper px-4 py-3 font-sans text-sm">{m.text}</pre> : null}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
