"use client";

import { useEffect, useRef, useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch, ApiError } from "@/app/_components/api";
import { inputClass, secondaryButtonClass } from "@/app/_components/field";
import { formatTimestamp } from "@/reports/format";

export interface SectionComment {
  id: string;
  kind: "comment" | "changes_requested" | "reply" | "submission_note";
  body: string;
  authorName: string;
  createdAt: string;
}

const KIND_LABEL: Record<SectionComment["kind"], string> = { comment: "Review comment", changes_requested: "Changes requested", reply: "Answer", submission_note: "Note with the submission" };

/** The review notes on one section, and the form to add one (a comment for the compliance head, an answer for the officer). */
export function SectionComments({ filingId, section, sectionTitle, comments, mode }: { filingId: string; section: string; sectionTitle: string; comments: SectionComment[]; mode: "comment" | "reply" | null }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [body, setBody] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const box = useRef<HTMLTextAreaElement>(null);
  const opener = useRef<HTMLButtonElement>(null);
  const wasOpen = useRef(false);
  // opening the form puts the cursor in the box; closing it gives focus back to the button that opened it
  useEffect(() => {
    if (open) box.current?.focus();
    else if (wasOpen.current) opener.current?.focus();
    wasOpen.current = open;
  }, [open]);
  if (!comments.length && !mode) return null;
  const id = `comment-${section}`;
  return (
    <aside aria-label={`Review notes on ${sectionTitle}`} className="mt-4 rounded-lg border border-ink-line bg-paper-sunk/60 p-4" data-testid={`comments-${section}`}>
      {comments.length ? (
        <ul className="flex flex-col gap-3">
          {comments.map((c) => (
            <li key={c.id} className="text-sm">
              <p className="text-xs text-ink-muted">
                <span className={c.kind === "changes_requested" ? "font-semibold text-alert" : "font-medium text-ink-soft"}>
                  <span aria-hidden="true">{c.kind === "changes_requested" ? "! " : c.kind === "reply" ? "↳ " : c.kind === "submission_note" ? "✉ " : "• "}</span>
                  {KIND_LABEL[c.kind]}
                </span>{" "}
                · {c.authorName} · {formatTimestamp(c.createdAt)}
              </p>
              <p className="mt-1 whitespace-pre-wrap leading-relaxed">{c.body}</p>
            </li>
          ))}
        </ul>
      ) : null}
      {mode ? (
        open ? (
          <form
            className={`flex flex-col gap-2 ${comments.length ? "mt-4" : ""}`}
            onSubmit={async (e) => {
              e.preventDefault();
              setPending(true);
              setError(null);
              try {
                await apiFetch(`/api/filings/${filingId}/${mode === "comment" ? "comments" : "replies"}`, { method: "POST", body: { section, body } });
                setBody("");
                setOpen(false);
                router.refresh();
              } catch (err) {
                setError(err instanceof ApiError ? (err.fields?.body ?? err.message) : "The note was not saved.");
              } finally {
                setPending(false);
              }
            }}
          >
            <label htmlFor={id} className="text-sm font-medium">
              {mode === "comment" ? `Comment on ${sectionTitle}` : `Answer on ${sectionTitle}`}
            </label>
            <textarea ref={box} id={id} rows={3} className={inputClass} value={body} onChange={(e) => setBody(e.target.value)} aria-invalid={Boolean(error)} />
            {error ? (
              <p role="alert" className="text-sm text-alert">
                {error}
              </p>
            ) : null}
            <div className="flex gap-2">
              <button type="submit" className={secondaryButtonClass} disabled={pending}>
                {pending ? "Saving…" : mode === "comment" ? "Add comment" : "Add answer"}
              </button>
              <button type="button" className="text-sm underline" onClick={() => setOpen(false)}>
                Cancel
              </button>
            </div>
          </form>
        ) : (
          <button ref={opener} type="button" className={`text-sm font-medium underline ${comments.length ? "mt-3" : ""}`} onClick={() => setOpen(true)}>
            {mode === "comment" ? `Comment on ${sectionTitle.toLowerCase()}` : `Answer on ${sectionTitle.toLowerCase()}`}
          </button>
        )
      ) : null}
    </aside>
  );
}
