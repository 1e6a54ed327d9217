/**
 * `sure-enough <command>`: the analysts' edge of the pure core (the contract: src/cli/README.md).
 * Each command lives in its own module and returns its stdout text; errors are UsageError → exit 2.
 */
import { commands } from './commands.ts';
import { parseArgs, UsageError } from './io.ts';

async function main(argv: readonly string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === 'help' || name === '--help' || name === '-h') {
    process.stdout.write(await commands.help!.run(parseArgs(rest)));
    return 0;
  }
  const command = commands[name];
  if (!command) throw new UsageError(`unknown command "${name}"; try \`sure-enough help\``);
  const out = await command.run(parseArgs(rest));
  process.stdout.write(out);
  return 0;
}

try {
  process.exitCode = await main(process.argv.slice(2));
} catch (err) {
  if (err instanceof UsageError || err instanceof RangeError) {
    process.stderr.write(`sure-enough: ${err.message}\n`);
    process.exitCode = 2;
  } else {
    process.stderr.write(`sure-enough: internal error: ${(err as Error).stack ?? String(err)}\n`);
    process.exitCode = 1;
  }
}
