"use client";

import { primaryButtonClass, secondaryButtonClass } from "@/app/_components/field";
import { useSend } from "./use-send";
import { Alert } from "./alert";

/** Assemble the draft from the marked run, or rebuild the open draft from it. */
export function PrepareButton({ periodId, rebuild }: { periodId: string; rebuild: boolean }) {
  const { send, error, pending } = useSend();
  return (
    <div className="flex flex-col items-start gap-2">
      <button type="button" className={rebuild ? secondaryButtonClass : primaryButtonClass} disabled={pending} onClick={() => void send(`/api/periods/${periodId}/filing`, "POST", {})}>
        {pending ? "Assembling…" : rebuild ? "Rebuild from the marked run" : "Assemble the draft filing"}
      </button>
      <Alert message={error?.message} testId="prepare-error" />
    </div>
  );
}
