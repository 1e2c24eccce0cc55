/**
 * Bounds on the figures a file may carry. A number past them is not a plausible position or price (1e308 is a
 * typing slip or a test of the system), and would overflow the engine's arithmetic later with a message naming
 * neither row nor column; it is refused at the edge, naming both.
 */

/** The largest magnitude of a quantity, price, market value, delta or close (a thousand trillion). */
export const MAX_FIGURE = 1e15;

/** Why a figure is out of bounds, or null when it is within them. */
export function figureOutOfBounds(label: string, value: number): string | null {
  if (Math.abs(value) <= MAX_FIGURE) return null;
  return `${label} ${value} is beyond ±${MAX_FIGURE.toExponential(0)}: not a plausible figure (check the column and the number format)`;
}
