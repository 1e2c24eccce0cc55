/** Command-line commands of the volatility engine (fit, compare). */
export const commands: Record<string, (argv: string[]) => void | Promise<void>> = {};
