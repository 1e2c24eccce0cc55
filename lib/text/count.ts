/**
 * Counted words and shortened lists, in one place for every screen, pack and engine message: "1 exception",
 * "12 exceptions", and "12 factors … (10 of them listed: A, B, …)". Pure: no framework or I/O imports.
 */

/** The word for `n` of it: the singular for exactly one, else the plural (`${singular}s` unless given). */
export function plural(n: number, singular: string, pluralForm = `${singular}s`): string {
  return n === 1 ? singular : pluralForm;
}

/** `n` with its word, grouped in thousands: "1 exception", "2,540 cells". */
export function countOf(n: number, singular: string, pluralForm?: string): string {
  return `${n.toLocaleString("en-GB")} ${plural(n, singular, pluralForm)}`;
}

/** "is" or "are" for `n` things. */
export function isAre(n: number): string {
  return n === 1 ? "is" : "are";
}

/**
 * The first `max` items joined with `separator`; when some are left out, the text says how many are listed of how
 * many: "A, B, C" or "A, B (2 of 5 listed)".
 */
export function listSome(items: readonly string[], max = 10, separator = ", "): string {
  if (items.length <= max) return items.join(separator);
  return `${items.slice(0, max).join(separator)} (${max} of ${items.length.toLocaleString("en-GB")} listed)`;
}

/** The text with its first letter in capitals, for a sentence that starts with a value. */
export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
