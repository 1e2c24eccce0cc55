/**
 * File names of the packs: firm, period and version, safe on every file system and in a Content-Disposition header
 * (lower-case ASCII letters, digits and hyphens), e.g. "northmoor-brokerage-ltd-filing-pack-2026-11-30-v2.docx".
 */
import type { FilingViewModel } from "./view-model";

export const PACK_CONTENT_TYPES = {
  docx: "application/vnd.openxmlformats-officedocument.wordprocessingml.document",
  xlsx: "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet",
} as const;

/** Lower-case ASCII slug: accents dropped, anything else becomes a hyphen. */
export function slug(text: string): string {
  return (
    text
      .normalize("NFKD")
      .replace(/[\u0300-\u036f]/g, "")
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "") || "firm"
  );
}

export function packFileName(vm: Pick<FilingViewModel, "firm" | "period" | "filing">, kind: keyof typeof PACK_CONTENT_TYPES): string {
  return `${slug(vm.firm.name)}-filing-pack-${vm.period.end.slice(0, 10)}-v${vm.filing.version}.${kind}`;
}
