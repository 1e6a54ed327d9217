/** The command line's edge to the process: reading input, and the one error convention (exit 2, stderr only). */
import { readFileSync } from 'node:fs';

/** A user mistake (bad flag, bad line): printed on stderr with exit code 2, nothing on stdout. */
export class UsageError extends Error {
  override name = 'UsageError';
}

/** Reads FILE, or standard input when FILE is `-` or absent. */
export function readInput(file: string | undefined): string {
  try {
    return readFileSync(file === undefined || file === '-' ? 0 : file, 'utf8');
  } catch (err) {
    throw new UsageError(`cannot read ${file ?? 'standard input'}: ${(err as Error).message}`);
  }
}

/** Parsed command line: positional arguments and `--flag value` / `--flag=value` pairs. */
export interface ParsedArgs {
  positional: string[];
  flags: Map<string, string>;
}

/** Flags that take no value. */
const BOOLEAN_FLAGS = new Set(['help', 'naive-too', 'dictionary']);

export function parseArgs(argv: readonly string[]): ParsedArgs {
  const positional: string[] = [];
  const flags = new Map<string, string>();
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!;
    if (arg.startsWith('--')) {
      const eq = arg.indexOf('=');
      const name = eq >= 0 ? arg.slice(2, eq) : arg.slice(2);
      if (name === '') throw new UsageError(`flag ${arg}: empty flag name`);
      let value: string;
      if (eq >= 0) value = arg.slice(eq + 1);
      else if (BOOLEAN_FLAGS.has(name)) value = 'true';
      else {
        const next = argv[i + 1];
        if (next === undefined || (next.startsWith('--') && next !== '-'))
          throw new UsageError(`flag --${name} needs a value`);
        value = next;
        i++;
      }
      if (flags.has(name)) throw new UsageError(`flag --${name} given twice`);
      flags.set(name, value);
    } else positional.push(arg);
  }
  return { positional, flags };
}
