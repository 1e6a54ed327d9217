/** The command line's edge to the process: reading input, the arguments, and the one error convention. */
import { readFileSync } from 'node:fs';
import { parseArgs as parseTokens } from 'node:util';

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

/** The flags a command takes: each takes a value (`string`) or none (`boolean`). */
export type FlagSpec = Readonly<Record<string, 'string' | 'boolean'>>;

/** Parsed command line: positional arguments and `--flag value` / `--flag=value` pairs. */
export interface ParsedArgs {
  positional: string[];
  /** Flag name → value as typed; `'true'` for a flag that takes no value. */
  flags: Map<string, string>;
}

/**
 * Splits argv by Node's `util.parseArgs` and refuses what the command does not declare: an unknown flag
 * is named as unknown, a flag without its value, a value given to a flag that takes none, a flag given
 * twice. Node's own strict mode is not used because it refuses a value that starts with a dash after a
 * space (`--iwao-alpha -0.5`, `--target limit:-3` is fine either way), which the study flags need; the
 * tokens give the same strictness here, in this command line's words. `help` is the command's name for
 * `sure-enough help COMMAND`.
 */
export function parseArgs(argv: readonly string[], spec: FlagSpec, help = ''): ParsedArgs {
  const options = Object.fromEntries(Object.entries(spec).map(([name, type]) => [name, { type }]));
  const { tokens } = parseTokens({
    args: [...argv],
    options,
    strict: false,
    allowPositionals: true,
    tokens: true,
  });
  const positional: string[] = [];
  const flags = new Map<string, string>();
  for (const t of tokens) {
    if (t.kind === 'positional') positional.push(t.value);
    if (t.kind !== 'option') continue;
    const type = t.rawName.startsWith('--') && Object.hasOwn(spec, t.name) ? spec[t.name] : undefined;
    if (type === undefined)
      throw new UsageError(`unknown flag ${t.rawName}; see \`sure-enough help${help ? ` ${help}` : ''}\``);
    let value: string;
    if (type === 'boolean') {
      if (t.value !== undefined) throw new UsageError(`flag --${t.name} takes no value`);
      value = 'true';
    } else {
      // `--kind --level 0.9`: the next word is another flag, so --kind was given no value
      if (t.value === undefined || (!t.inlineValue && t.value.startsWith('--')))
        throw new UsageError(`flag --${t.name} needs a value`);
      value = t.value;
    }
    if (flags.has(t.name)) throw new UsageError(`flag --${t.name} given twice`);
    flags.set(t.name, value);
  }
  return { positional, flags };
}
