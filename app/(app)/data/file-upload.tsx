"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { UploadButton } from "@/app/_components/upload-button";
import { inputClass, SelectOptions } from "@/app/_components/field";
import type { DateFormat, NumberFormat } from "@/lib/uploads/types";
import { FormatSelect } from "./_components/format-select";

interface Props {
  kind: "positions" | "prices";
  periods?: { id: string; label: string }[];
}

/**
 * Choose how numbers are written (and, for positions, the period), then upload a CSV or XLSX file. The file goes
 * to the upload service; Ballast reads it back, checks it, and opens the preview. Nothing is stored in the period
 * or the price history until someone confirms the preview.
 */
export function FileUpload({ kind, periods = [] }: Props) {
  const router = useRouter();
  const [numberFormat, setNumberFormat] = useState<NumberFormat>("plain");
  const [dateFormat, setDateFormat] = useState<DateFormat>("iso");
  const [periodId, setPeriodId] = useState(periods[0]?.id ?? "");
  const [message, setMessage] = useState<{ tone: "ok" | "alert"; text: string } | null>(null);
  const id = `${kind}-upload`;

  const common = {
    onUploadBegin: () => setMessage({ tone: "ok" as const, text: "Uploading and checking the file…" }),
    onUploadError: (error: Error) =>
      setMessage({
        tone: "alert" as const,
        text: /fetch|network|Failed to/i.test(error.message)
          ? `The upload service did not answer (${error.message}). Nothing was stored; try again.`
          : `${error.message} Nothing was stored.`,
      }),
    onClientUploadComplete: (files: { serverData: { uploadId: string | null; duplicate: boolean; error?: string } }[]) => {
      const result = files[0]?.serverData;
      if (!result?.uploadId) {
        setMessage({ tone: "alert", text: result?.error ?? "The file could not be processed. Nothing was stored; try again." });
        return;
      }
      setMessage({ tone: "ok", text: result.duplicate ? "This exact file was uploaded before; opening that upload." : "Checked. Opening the preview…" });
      router.push(`/data/uploads/${result.uploadId}${result.duplicate ? "?duplicate=1" : ""}`);
    },
    appearance: {
      button: "w-auto whitespace-nowrap bg-brass hover:bg-brass-dark text-white font-medium px-4 ut-ready:bg-brass ut-uploading:bg-brass-dark ut-uploading:cursor-not-allowed",
      allowedContent: "text-ink-muted text-xs",
    },
    content: {
      button: ({ ready, isUploading }: { ready: boolean; isUploading: boolean }) => (isUploading ? "Uploading…" : ready ? `Upload ${kind === "positions" ? "positions" : "price history"}` : "Getting ready…"),
      allowedContent: () => `CSV or XLSX, up to ${kind === "positions" ? "32" : "64"} MB`,
    },
  };

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        {kind === "positions" ? (
          <label className="flex flex-col gap-1 text-sm" htmlFor={`${id}-period`}>
            Reporting period
            <select id={`${id}-period`} className={inputClass} value={periodId} onChange={(e) => setPeriodId(e.target.value)}>
              <SelectOptions options={periods.map((p) => [p.id, p.label])} />
            </select>
          </label>
        ) : null}
        <FormatSelect what="numbers" id={`${id}-format`} value={numberFormat} onChange={(e) => setNumberFormat(e.target.value as NumberFormat)} />
        <FormatSelect what="dates" id={`${id}-date-format`} value={dateFormat} onChange={(e) => setDateFormat(e.target.value as DateFormat)} />
        <div data-testid={`${kind}-upload-button`}>
          {kind === "positions" ? (
            periodId ? (
              <UploadButton endpoint="positions" input={{ periodId, numberFormat, dateFormat }} {...common} />
            ) : (
              <p className="text-sm text-ink-muted">Open a reporting period first.</p>
            )
          ) : (
            <UploadButton endpoint="prices" input={{ numberFormat, dateFormat }} {...common} />
          )}
        </div>
      </div>
      {message ? (
        <p role="status" data-testid={`${kind}-upload-status`} className={`text-sm ${message.tone === "ok" ? "text-ink-soft" : "text-alert"}`}>
          {message.text}
        </p>
      ) : null}
    </div>
  );
}
