/** positions-import-100k: parse, validate and store 100,000 position rows (receive + confirm); target ≤ 5 s. */
import { emit } from "../emit";
import { benchDatabase, peakRssMiB } from "../upload-bench";
import { receiveUploadBytes, confirmUpload } from "@/lib/data/uploads";

const ROWS = 100_000;
const lines = ["as_of,book,instrument_id,instrument_name,asset_class,currency,quantity,price,market_value,delta_exposure"];
for (let i = 0; i < ROWS; i++) {
  const quantity = (i % 97) + 1;
  lines.push(`2026-11-30,BOOK-${i % 9},EQ-${i},Instrument ${i},equity,EUR,${quantity},12.5,${(quantity * 12.5).toFixed(2)},`);
}
const bytes = new TextEncoder().encode(lines.join("\n") + "\n");

(async () => {
  const { actor, periodId } = await benchDatabase("tomas.reyne@northmoor.example");
  const start = performance.now();
  const { uploadId } = await receiveUploadBytes(
    { firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId, kind: "positions", numberFormat: "plain" },
    { key: "bench", name: "positions-100k.csv", ufsUrl: "http://127.0.0.1:9/f/bench" },
    bytes,
  );
  const result = await confirmUpload(actor, uploadId, { acknowledgeWarnings: true });
  const ms = performance.now() - start;
  if (!("stored" in result) || result.stored !== ROWS) throw new Error(`stored ${JSON.stringify(result)}`);
  emit({ name: "positions-import-100k", value: Math.round(ms), unit: "ms", runs: 1, target: 5000, peakRssMiB: Math.round(peakRssMiB()), bytes: bytes.length });
})();
