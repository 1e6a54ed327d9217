/** The command registry. Each command module exports `{ summary, run(args) → stdout text }`. */
import * as assess from './assess.ts';
import { helpText } from './help.ts';
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
  assess,
  replay: pending('replay'),
  bundle: pending('bundle'),
  export: pending('export'),
  merge: pending('merge'),
  help: {
    summary: 'this help; `help COMMAND` for one command (e.g. `help assess`)',
    run: (args) => {
      const topic = args.positional[0];
      if (topic !== undefined && !(topic in commands))
        throw new UsageError(`no help topic "${topic}"; try \`sure-enough help\``);
      return helpText(
        topic,
        Object.entries(commands).map(([k, c]) => [k, c.summary] as const),
      );
    },
  },
};
