/**
 * `sure-enough <command>`: the analysts' edge of the pure core (the contract: src/cli/README.md).
 * Each command lives in its own module, declares its flags and returns its stdout text; errors are
 * UsageError → exit 2. `COMMAND --help` is `help COMMAND`.
 */
import { commands } from './commands.ts';
import { parseArgs, UsageError } from './io.ts';

async function main(argv: readonly string[]): Promise<number> {
  const [name, ...rest] = argv;
  const help = commands.help!;
  if (name === undefined || name === 'help' || name === '--help' || name === '-h') {
    process.stdout.write(await help.run(parseArgs(rest, help.flags, 'help')));
    return 0;
  }
  const command = Object.hasOwn(commands, name) ? commands[name] : undefined;
  if (!command) throw new UsageError(`unknown command "${name}"; try \`sure-enough help\``);
  const args = parseArgs(rest, { ...command.flags, help: 'boolean' }, name);
  if (args.flags.has('help')) {
    process.stdout.write(await help.run({ positional: [name], flags: new Map() }));
    return 0;
  }
  const out = await command.run(args);
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
