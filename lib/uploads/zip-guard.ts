/**
 * A workbook is a zip archive. Before unpacking one, read its central directory and refuse an archive whose
 * expanded size or entry count is out of proportion (a "zip bomb"); then inflate every entry as a stream with a
 * hard cap on the bytes it actually produces, since the sizes an archive declares can lie.
 */
import { createInflateRaw } from "node:zlib";
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

/** The most bytes the entries of an archive of `size` bytes may really expand to. */
export function expansionCap(size: number): number {
  return Math.min(MAX_EXPANDED_BYTES, MAX_EXPANSION_RATIO * Math.max(size, 1));
}

function outOfProportion(size: number): FileRejected {
  return new FileRejected(
    `The workbook expands to more than ${Math.round(expansionCap(size) / 1024 / 1024)} MB from ${Math.round(size / 1024)} KB, out of proportion for a data file; it was not opened.`,
  );
}

/** Inflate one deflated entry as a stream, counting what comes out; stop as soon as the count passes `cap`. */
function inflatedLength(data: Uint8Array, cap: number): Promise<number> {
  return new Promise((resolve, reject) => {
    const inflate = createInflateRaw({ chunkSize: 64 * 1024 });
    let produced = 0;
    let settled = false;
    const settle = (fn: () => void) => {
      if (settled) return;
      settled = true;
      fn();
    };
    inflate.on("data", (chunk: Buffer) => {
      produced += chunk.length;
      if (produced > cap) {
        inflate.destroy();
        settle(() => reject(new RangeError("cap")));
      }
    });
    inflate.on("end", () => settle(() => resolve(produced)));
    inflate.on("error", () => settle(() => reject(new FileRejected("The workbook is damaged: one of its parts cannot be unpacked."))));
    inflate.end(Buffer.from(data.buffer, data.byteOffset, data.byteLength));
  });
}

/**
 * Inflate every entry of the archive (stored or deflated) through node:zlib under one shared cap on the bytes
 * really produced, trusting neither the declared sizes nor the declared compressed lengths (each entry is read
 * from its local header to the next one). Throws FileRejected past the cap, for damage or unknown compression.
 */
export async function checkZipInflation(bytes: Uint8Array): Promise<{ entries: number; inflatedBytes: number }> {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const { entries } = checkZipProportions(bytes);
  // Local header offsets from the central directory, checked and sorted, bound each entry's data.
  let eocd = -1;
  for (let i = bytes.length - 22; i >= Math.max(0, bytes.length - 22 - 65_535); i--) {
    if (view.getUint32(i, true) === 0x06054b50) {
      eocd = i;
      break;
    }
  }
  const directoryOffset = view.getUint32(eocd + 16, true);
  const locals: number[] = [];
  let offset = directoryOffset;
  for (let n = 0; n < entries; n++) {
    const local = view.getUint32(offset + 42, true);
    if (local + 30 > directoryOffset || view.getUint32(local, true) !== 0x04034b50) {
      throw new FileRejected("The workbook is damaged: a part of it cannot be found.");
    }
    locals.push(local);
    offset += 46 + view.getUint16(offset + 28, true) + view.getUint16(offset + 30, true) + view.getUint16(offset + 32, true);
  }
  const sorted = [...new Set(locals)].sort((a, b) => a - b);
  const cap = expansionCap(bytes.length);
  let inflatedBytes = 0;
  for (let i = 0; i < sorted.length; i++) {
    const local = sorted[i];
    const method = view.getUint16(local + 8, true);
    const start = local + 30 + view.getUint16(local + 26, true) + view.getUint16(local + 28, true);
    const end = i + 1 < sorted.length ? sorted[i + 1] : directoryOffset;
    if (start > end) throw new FileRejected("The workbook is damaged: a part of it overlaps another.");
    const data = bytes.subarray(start, end);
    if (method === 0) inflatedBytes += data.byteLength;
    else if (method === 8) {
      try {
        inflatedBytes += await inflatedLength(data, cap - inflatedBytes);
      } catch (error) {
        if (error instanceof RangeError) throw outOfProportion(bytes.length);
        throw error;
      }
    } else throw new FileRejected("The workbook uses a compression Ballast does not read; save it again as .xlsx.");
    if (inflatedBytes > cap) throw outOfProportion(bytes.length);
  }
  return { entries, inflatedBytes };
}
