/**
 * A workbook is a zip archive. Before unpacking one, read its central directory and refuse an archive whose
 * expanded size or entry count is out of proportion (a "zip bomb").
 */
import { FileRejected } from "./types";

export const MAX_ZIP_ENTRIES = 2_000;
export const MAX_EXPANDED_BYTES = 400 * 1024 * 1024;
export const MAX_EXPANSION_RATIO = 150;

/** Throws FileRejected when the zip's declared contents are out of proportion to its size. */
export function checkZipProportions(bytes: Uint8Array): { entries: number; expandedBytes: number } {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  // End of central directory: signature 0x06054b50 within the last 64 KiB + 22 bytes.
  let eocd = -1;
  for (let i = bytes.length - 22; i >= Math.max(0, bytes.length - 22 - 65_535); i--) {
    if (view.getUint32(i, true) === 0x06054b50) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0) throw new FileRejected("The workbook is damaged: its zip directory is missing.");
  const entries = view.getUint16(eocd + 10, true);
  const directoryOffset = view.getUint32(eocd + 16, true);
  if (entries > MAX_ZIP_ENTRIES) throw new FileRejected(`The workbook holds ${entries} parts; Ballast reads at most ${MAX_ZIP_ENTRIES}.`);
  let expandedBytes = 0;
  let offset = directoryOffset;
  for (let n = 0; n < entries; n++) {
    if (offset + 46 > bytes.length || view.getUint32(offset, true) !== 0x02014b50) {
      throw new FileRejected("The workbook is damaged: its zip directory cannot be read.");
    }
    expandedBytes += view.getUint32(offset + 24, true);
    const nameLength = view.getUint16(offset + 28, true);
    const extraLength = view.getUint16(offset + 30, true);
    const commentLength = view.getUint16(offset + 32, true);
    offset += 46 + nameLength + extraLength + commentLength;
  }
  if (expandedBytes > MAX_EXPANDED_BYTES || expandedBytes > MAX_EXPANSION_RATIO * Math.max(bytes.length, 1)) {
    throw new FileRejected(
      `The workbook would expand to ${Math.round(expandedBytes / 1024 / 1024)} MB from ${Math.round(bytes.length / 1024)} KB, out of proportion for a data file; it was not opened.`,
    );
  }
  return { entries, expandedBytes };
}
