/** The command registry. Each command module exports `{ summary, run(args) → stdout text }`. */
import type { ParsedArgs } from './io.ts';
import { UsageError } from './io.ts';

export interface Command {
  summary: string;
  run(args: ParsedArgs): string;
}

function pending(name: string): Command {
  return {
    summary: `${name} (in development)`,
    run() {
      throw new UsageError(`${name} is not available in this build yet`);
    },
  };
}

export const commands: Record<string, Command> = {
  assess: pending('assess'),
  replay: pending('replay'),
  bundle: pending('bundle'),
  export: pending('export'),
  merge: pending('merge'),
  help: {
    summary: 'this help',
    run: () =>
      `usage: sure-enough <command> [flags] [FILE|-]\n\n${Object.entries(commands)
        .map(([k, c]) => `  ${k.padEnd(8)} ${c.summary}`)
        .join('\n')}\n`,
  },
};
