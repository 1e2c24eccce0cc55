/**
 * The guards that bound work an attacker can ask for: business-day arithmetic over a long range (a period month far
 * in the past once froze the server for 26–29 s per page), and the zip inflation cap on a workbook whose headers lie
 * about its sizes. Prints the median time and, for the zip, the bytes really inflated before refusing.
 */
import { performance } from "node:perf_hooks";
import { emit, median } from "../emit";
import { businessDaysBetween } from "../../../lib/calendar/deadline";
import { checkZipInflation, expansionCap } from "../../../lib/uploads/zip-guard";
import { lyingZip } from "../../unit/helpers/lying-zip";

const holidays = new Set(Array.from({ length: 200 }, (_, i) => `${2000 + Math.floor(i / 10)}-12-${String(20 + (i % 10)).padStart(2, "0")}`));
const times: number[] = [];
for (let i = 0; i < 50; i++) {
  const start = performance.now();
  businessDaysBetween("0001-01-01", "9999-12-31", holidays);
  times.push(performance.now() - start);
}
emit({ name: "business-days-0001-to-9999", value: +median(times).toFixed(4), unit: "ms", runs: times.length, target: 1, note: "3.65 million days, 200 holidays" });

async function zipBench(): Promise<void> {
const bomb = await lyingZip([{ name: "xl/worksheets/sheet1.xml", realBytes: 1024 * 1024 * 1024 }]);
const zipTimes: number[] = [];
const rss: number[] = [];
for (let i = 0; i < 5; i++) {
  const before = process.memoryUsage().rss;
  const start = performance.now();
  await checkZipInflation(bomb).catch(() => undefined);
  zipTimes.push(performance.now() - start);
  rss.push(process.memoryUsage().rss - before);
}
emit({
  name: "zip-bomb-1GiB-declared-1000B",
  value: +median(zipTimes).toFixed(1),
  unit: "ms",
  runs: zipTimes.length,
  fileBytes: bomb.length,
  capBytes: expansionCap(bomb.length),
  rssGrowthMiB: +(median(rss) / 1024 / 1024).toFixed(1),
  note: "refused after inflating at most the cap (150 × file size); nothing kept",
});
}

void zipBench();
