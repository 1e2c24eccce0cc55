/** Command-line commands of the portfolio engine (var, backtest, capital). */
export const commands: Record<string, (argv: string[]) => void | Promise<void>> = {};
