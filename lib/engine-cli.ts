/**
 * Ballast's engine on the command line: `npm run -s engine -- <command> [options] --json`.
 * Reads CSV, prints one JSON object; bad input exits 1 with one line naming the problem.
 */
import { CliError } from "./engine-cli/io";
import { commands as volatilityCommands } from "./engine-cli/volatility";
import { commands as portfolioCommands } from "./engine-cli/portfolio";
import { commands as standardisedCommands } from "./engine-cli/standardised";
import { commands as runCommands } from "./engine-cli/run";

const commands: Record<string, (argv: string[]) => void | Promise<void>> = {
  ...volatilityCommands,
  ...portfolioCommands,
  ...standardisedCommands,
  ...runCommands,
};

async function main(argv: string[]): Promise<void> {
  const [command, ...rest] = argv;
  if (!command || command === "help" || command === "--help") {
    process.stdout.write(`usage: npm run -s engine -- <${Object.keys(commands).join("|")}> [options] --json\n`);
    return;
  }
  const handler = commands[command];
  if (!handler) throw new CliError(`unknown command "${command}" (one of: ${Object.keys(commands).join(", ")})`);
  await handler(rest);
}

main(process.argv.slice(2)).catch((error: unknown) => {
  const message = error instanceof Error ? error.message : String(error);
  process.stderr.write(`engine: ${message}\n`);
  process.exit(1);
});
