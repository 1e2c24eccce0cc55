"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch, ApiError } from "@/app/_components/api";
import { formatDate } from "@/app/_components/format";
import { inputClass, primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { dateProblem } from "@/lib/calendar/validation";
import type { Holiday } from "@/lib/data/calendar-settings";
import { useHydrated } from "@/app/_components/use-hydrated";
import { saveFailed, SaveStatusLine, type SaveStatus } from "./save-status";

/** The firm's holidays: add and remove by hand, or take a CSV file (any bad row refuses the whole file). */
export function HolidaysPanel({ initial }: { initial: Holiday[] }) {
  const router = useRouter();
  // a file chosen before the page is hydrated would be dropped: the picker waits for it
  const hydrated = useHydrated();
  const [list, setList] = useState<Holiday[]>(initial);
  const [date, setDate] = useState("");
  const [name, setName] = useState("");
  const [addError, setAddError] = useState<string | null>(null);
  const [status, setStatus] = useState<SaveStatus>(null);
  const [rowErrors, setRowErrors] = useState<string[]>([]);
  const [mode, setMode] = useState<"add" | "replace">("add");
  const [busy, setBusy] = useState(false);

  async function save(next: Holiday[], message: string) {
    setBusy(true);
    setStatus(null);
    try {
      const saved = await apiFetch<{ holidays: Holiday[] }>("/api/holidays", { method: "PUT", body: { holidays: next } });
      setList(saved.holidays);
      setStatus({ tone: "ok", text: message });
      router.refresh();
    } catch (e) {
      setStatus(saveFailed(e));
    } finally {
      setBusy(false);
    }
  }

  function add(event: React.FormEvent) {
    event.preventDefault();
    const problem = dateProblem(date.trim());
    if (problem) return setAddError(problem);
    if (list.some((h) => h.date === date.trim())) return setAddError(`${date.trim()} is already a holiday.`);
    if (name.trim().length > 80) return setAddError("A holiday name has at most 80 characters.");
    setAddError(null);
    const next = [...list, { date: date.trim(), name: name.trim() }].sort((a, b) => a.date.localeCompare(b.date));
    void save(next, `Added ${formatDate(date.trim())}.`).then(() => {
      setDate("");
      setName("");
    });
  }

  async function upload(event: React.ChangeEvent<HTMLInputElement>) {
    const file = event.target.files?.[0];
    event.target.value = "";
    if (!file) return;
    setRowErrors([]);
    setStatus(null);
    setBusy(true);
    try {
      const result = await apiFetch<{ holidays: Holiday[]; imported: number }>("/api/holidays/import", { method: "POST", body: { csv: await file.text(), mode } });
      setList(result.holidays);
      setStatus({ tone: "ok", text: `Took ${result.imported} holiday${result.imported === 1 ? "" : "s"} from ${file.name}.` });
      router.refresh();
    } catch (e) {
      if (e instanceof ApiError && e.fields) setRowErrors(Object.entries(e.fields).map(([row, message]) => `${row.charAt(0).toUpperCase()}${row.slice(1)}: ${message}`));
      setStatus({ tone: "alert", text: e instanceof ApiError && e.fields ? `${file.name} was refused; nothing was stored.` : e instanceof Error ? e.message : "Could not read the file." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-col gap-4 rounded-lg border border-ink-line bg-paper-raised p-5">
      {list.length === 0 ? (
        <p className="text-sm text-ink-soft">No holidays: only weekends are skipped.</p>
      ) : (
        <ul className="divide-y divide-ink-line rounded-md border border-ink-line" data-testid="holiday-list">
          {list.map((h) => (
            <li key={h.date} className="flex items-center justify-between gap-3 px-3 py-2 text-sm">
              <span>
                <span className="figure font-medium">{formatDate(h.date)}</span>
                {h.name ? <span className="text-ink-soft"> · {h.name}</span> : null}
              </span>
              <button
                type="button"
                className="text-sm underline disabled:opacity-60"
                disabled={busy}
                aria-label={`Remove ${formatDate(h.date)}`}
                onClick={() => save(list.filter((x) => x.date !== h.date), `Removed ${formatDate(h.date)}.`)}
              >
                Remove
              </button>
            </li>
          ))}
        </ul>
      )}

      <form onSubmit={add} noValidate className="grid gap-2 sm:grid-cols-[10rem_1fr_auto] sm:items-end">
        <div className="flex flex-col gap-1">
          <label htmlFor="holiday-date" className="text-sm font-medium">
            Date
          </label>
          <input id="holiday-date" type="date" className={inputClass} value={date} onChange={(e) => setDate(e.target.value)} aria-invalid={Boolean(addError)} aria-describedby={addError ? "holiday-date-error" : undefined} />
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor="holiday-name" className="text-sm font-medium">
            Name (optional)
          </label>
          <input id="holiday-name" className={inputClass} value={name} onChange={(e) => setName(e.target.value)} />
        </div>
        <button type="submit" className={primaryButtonClass} disabled={busy}>
          Add holiday
        </button>
        {addError ? (
          <p id="holiday-date-error" role="alert" className="text-sm text-alert sm:col-span-3">
            {addError}
          </p>
        ) : null}
      </form>

      <fieldset className="flex flex-col gap-2 border-t border-ink-line pt-4">
        <legend className="pt-4 text-sm font-medium">Take holidays from a CSV file</legend>
        <p className="text-xs text-ink-muted">One holiday per row: a date written yyyy-mm-dd, then an optional name (a header row “date,name” is fine). A file with any bad row is refused as a whole.</p>
        <div className="flex flex-wrap items-center gap-4 text-sm">
          <label className="flex items-center gap-1">
            <input type="radio" name="holiday-mode" checked={mode === "add"} onChange={() => setMode("add")} /> Add to the list
          </label>
          <label className="flex items-center gap-1">
            <input type="radio" name="holiday-mode" checked={mode === "replace"} onChange={() => setMode("replace")} /> Replace the list
          </label>
          <label className={`${secondaryButtonClass} cursor-pointer`}>
            Choose CSV file…
            <input type="file" accept=".csv,text/csv" className="sr-only" disabled={busy || !hydrated} onChange={upload} aria-label="Holiday CSV file" />
          </label>
        </div>
      </fieldset>

      <SaveStatusLine status={status} />
      {rowErrors.length ? (
        <ul role="alert" aria-label="Problems in the file" className="list-inside list-disc rounded-md border border-alert/30 bg-alert-bg px-3 py-2 text-sm text-alert" data-testid="csv-errors">
          {rowErrors.map((e) => (
            <li key={e}>{e}</li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
