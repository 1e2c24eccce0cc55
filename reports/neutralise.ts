/**
 * Text that a spreadsheet could take for a formula. A cell whose text begins with `=`, `+`, `-` or `@` (or a tab or
 * carriage return, which some programs strip before reading the rest) can be evaluated when a person pastes it,
 * re-saves the sheet as CSV and opens that, or edits the cell.
 *
 * The choice, used by both packs:
 * - The workbook writes every text as a string (a shared string, never a formula), and in addition prefixes such
 *   text with a single quote character `'`, visible in the cell. The quote is the marker people know from
 *   spreadsheets, it survives a copy to CSV, and a reader sees that the text was neutralised (an invisible marker
 *   would change the text without showing it).
 * - The Word pack cannot evaluate anything, but it shows the same text as the workbook wherever a text comes from
 *   data or a person (instrument and factor names, data-quality messages, cover note, exception explanations),
 *   so that text copied from a Word table into a sheet is just as inert. Ballast's own wording never needs it.
 * - The signed content (canonical JSON) keeps the text exactly as entered: neutralising happens when a pack is
 *   written, never before hashing.
 */

/** The characters that make a text look like a formula at its start. */
export const FORMULA_TRIGGERS = ["=", "+", "-", "@", "\t", "\r"] as const;

/** The marker put in front of formula-looking text. */
export const NEUTRAL_PREFIX = "'";

/** Whether a text would be taken for a formula by a spreadsheet. */
export function looksLikeFormula(text: string): boolean {
  return text.length > 0 && (FORMULA_TRIGGERS as readonly string[]).includes(text[0]);
}

/** The text with the marker in front when it looks like a formula; other text unchanged. */
export function neutralise(text: string): string {
  return looksLikeFormula(text) ? NEUTRAL_PREFIX + text : text;
}
