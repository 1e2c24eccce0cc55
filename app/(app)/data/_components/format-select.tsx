import type { SelectHTMLAttributes } from "react";
import { inputClass, SelectOptions } from "@/app/_components/field";
import { DATE_FORMAT_LABELS, NUMBER_FORMAT_LABELS } from "@/lib/uploads/types";

/** How the file writes its numbers or its dates: a labelled select of the read options (controlled or not, as the caller passes). */
export function FormatSelect({ what, className = "", ...select }: { what: "numbers" | "dates"; className?: string } & SelectHTMLAttributes<HTMLSelectElement>) {
  const labels: Record<string, string> = what === "numbers" ? NUMBER_FORMAT_LABELS : DATE_FORMAT_LABELS;
  return (
    <label className={`flex flex-col gap-1 text-sm ${className}`.trim()} htmlFor={select.id}>
      {what === "numbers" ? "Numbers in the file" : "Dates in the file"}
      <select className={inputClass} {...select}>
        <SelectOptions options={Object.entries(labels)} />
      </select>
    </label>
  );
}
