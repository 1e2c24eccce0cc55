/**
 * Zip archives made by hand whose headers lie about their sizes. `lyingZip`: each entry declares `declared` bytes
 * uncompressed (and its real compressed length), while its deflate stream really expands to `realBytes` zeros,
 * built as a stream so the test never holds the expanded bytes. `outOfProportionZip`: a tiny archive declaring 1 GB.
 */
import { createDeflateRaw } from "node:zlib";

async function deflatedZeros(realBytes: number): Promise<Buffer> {
  const deflate = createDeflateRaw({ level: 9 });
  const chunks: Buffer[] = [];
  deflate.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<void>((resolve, reject) => {
    deflate.on("end", resolve);
    deflate.on("error", reject);
  });
  const block = Buffer.alloc(1024 * 1024);
  for (let left = realBytes; left > 0; left -= block.length) {
    const piece = left >= block.length ? block : block.subarray(0, left);
    if (!deflate.write(piece)) await new Promise((r) => deflate.once("drain", r));
  }
  deflate.end();
  await done;
  return Buffer.concat(chunks);
}

/** The archive: entry names with the real expansion of each, all declaring `declared` bytes. */
export async function lyingZip(entries: { name: string; realBytes: number }[], declared = 1000): Promise<Uint8Array> {
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  for (const entry of entries) {
    const data = await deflatedZeros(entry.realBytes);
    const name = Buffer.from(entry.name);
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4);
    local.writeUInt16LE(8, 8); // deflate
    local.writeUInt32LE(0, 14); // CRC left as 0: the guard must stop before any CRC would be checked
    local.writeUInt32LE(data.length, 18);
    local.writeUInt32LE(declared, 22);
    local.writeUInt16LE(name.length, 26);
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0);
    central.writeUInt16LE(20, 4);
    central.writeUInt16LE(20, 6);
    central.writeUInt16LE(8, 10);
    central.writeUInt32LE(data.length, 20);
    central.writeUInt32LE(declared, 24);
    central.writeUInt16LE(name.length, 28);
    central.writeUInt32LE(offset, 42);
    locals.push(local, name, data);
    centrals.push(central, name);
    offset += local.length + name.length + data.length;
  }
  const directory = Buffer.concat(centrals);
  const eocd = Buffer.alloc(22);
  eocd.writeUInt32LE(0x06054b50, 0);
  eocd.writeUInt16LE(entries.length, 8);
  eocd.writeUInt16LE(entries.length, 10);
  eocd.writeUInt32LE(directory.length, 12);
  eocd.writeUInt32LE(offset, 16);
  return new Uint8Array(Buffer.concat([...locals, directory, eocd]));
}

/**
 * A zip of about 100 bytes made by hand whose central directory declares one entry of 1 GB uncompressed (a
 * one-byte name, no data): out of any proportion to its size.
 */
export function outOfProportionZip(): Uint8Array {
  const entry = new Uint8Array(46 + 1);
  const dv = new DataView(entry.buffer);
  dv.setUint32(0, 0x02014b50, true);
  dv.setUint32(24, 1_000_000_000, true);
  dv.setUint16(28, 1, true);
  const eocd = new Uint8Array(22);
  const ev = new DataView(eocd.buffer);
  ev.setUint32(0, 0x06054b50, true);
  ev.setUint16(10, 1, true);
  ev.setUint32(16, 4, true);
  return new Uint8Array([0x50, 0x4b, 0x03, 0x04, ...entry, ...eocd]);
}
