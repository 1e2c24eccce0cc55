/**
 * prices-import-1m: parse, validate and store 1,000,000 price rows (500 instruments × 2,000 days); target ≤ 20 s.
 * prices-import-1m-last-step: how long the confirmation's last transaction (the one that holds the write lock while
 * the staged closes become current) takes.
 */
import { emit } from "../emit";
import { benchDatabase, peakRssMiB } from "../upload-bench";
import { receiveUploadBytes, applyConfirm } from "@/lib/data/uploads";

const INSTRUMENTS = 500;
const DAYS = 2000;
const dates: string[] = [];
for (let d = new Date(Date.UTC(2019, 0, 1)); dates.length < DAYS; d.setUTCDate(d.getUTCDate() + 1)) {
  if (d.getUTCDay() !== 0 && d.getUTCDay() !== 6) dates.push(d.toISOString().slice(0, 10));
}
const parts: string[] = ["date,instrument,close\n"];
for (let i = 0; i < INSTRUMENTS; i++) {
  let price = 100;
  for (let t = 0; t < DAYS; t++) {
    price *= 1 + 0.01 * Math.sin(i * 7 + t * 0.37);
    parts.push(`${dates[t]},INS-${i},${price.toFixed(4)}\n`);
  }
}
const bytes = new TextEncoder().encode(parts.join(""));
parts.length = 0;

(async () => {
  const { actor } = await benchDatabase("priya.castell@northmoor.example");
  const start = performance.now();
  const { uploadId } = await receiveUploadBytes(
    { firmId: actor.firmId, userId: actor.userId, userName: actor.name, periodId: null, kind: "prices", numberFormat: "plain" },
    { key: "bench", name: "prices-1m.csv", ufsUrl: "http://127.0.0.1:9/f/bench" },
    bytes,
  );
  let lastStep = 0;
  const result = await applyConfirm(actor.firmId, uploadId, {
    from: "pending",
    by: { userId: actor.userId, name: actor.name },
    warningsAcknowledged: 0,
    progress: async (stage) => {
      if (stage.startsWith("Making")) lastStep = performance.now();
    },
  });
  const ms = performance.now() - start;
  emit({ name: "prices-import-1m-last-step", value: Math.round(performance.now() - lastStep), unit: "ms", runs: 1, note: "the last transaction of the confirmation (write lock held)" });
  if (!("added" in result) || result.added !== INSTRUMENTS * DAYS) throw new Error(`stored ${JSON.stringify(result).slice(0, 200)}`);
  emit({ name: "prices-import-1m", value: Math.round(ms), unit: "ms", runs: 1, target: 20000, peakRssMiB: Math.round(peakRssMiB()), bytes: bytes.length });
})();
