/** One benchmark figure as a JSON line: name, value (the median), unit, runs, and any extra fields. */
export function emit(figure: { name: string; value: number; unit: string; runs: number } & Record<string, unknown>): void {
  process.stdout.write(JSON.stringify(figure) + "\n");
}

/** Median of a list of numbers. */
export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}
