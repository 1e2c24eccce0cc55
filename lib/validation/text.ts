/**
 * Free text that people and packs read back: control characters (NUL, escape…) and the invisible characters that
 * change how text is displayed (right-to-left overrides and isolates, zero-width marks, line and paragraph
 * separators) are refused, so a name, reference or note shows exactly what was typed and signed.
 */

// C0 and C1 controls and DEL, except tab, line feed and carriage return (allowed in multi-line text only).
const CONTROLS_SINGLE = /[\u0000-\u001f\u007f-\u009f]/u;
const CONTROLS_MULTI = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/u;
// Bidirectional embeddings, overrides and isolates; marks; zero-width space/joiners; separators; BOM.
const INVISIBLE = /[\u061c\u200b-\u200f\u2028-\u202e\u2060-\u2069\ufeff]/u;

/** The message a refused text gets (the field is named by the schema's path). */
export const CONTROL_CHARACTER_MESSAGE = "Remove control or invisible direction-changing characters (they would change how the text reads).";

/** Whether single-line text is clean: no control characters (not even tab or line breaks) and no invisible ones. */
export function isCleanLine(value: string): boolean {
  return !CONTROLS_SINGLE.test(value) && !INVISIBLE.test(value);
}

/** Whether multi-line text is clean: tab and line breaks allowed, other controls and invisible characters not. */
export function isCleanText(value: string): boolean {
  return !CONTROLS_MULTI.test(value) && !INVISIBLE.test(value);
}
