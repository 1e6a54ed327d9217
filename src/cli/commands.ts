/** The command registry. Each command module exports `{ summary, run(args) → stdout text (or its promise) }`. */
import * as assess from './assess.ts';
import * as bundle from './bundle.ts';
import * as exportCommand from './export.ts';
import { helpText } from './help.ts';
import type { FlagSpec, ParsedArgs } from './io.ts';
import { UsageError } from './io.ts';
import * as merge from './merge.ts';
import * as replay from './replay.ts';

export interface Command {
  summary: string;
  /** The flags this command takes; any other flag is refused as unknown (src/cli/io.ts). */
  flags: FlagSpec;
  run(args: ParsedArgs): string | Promise<string>;
  /** Full text for `help COMMAND` (commands without it are covered by help.ts). */
  help?: string;
}

export const commands: Record<string, Command> = {
  assess,
  replay,
  bundle,
  export: exportCommand,
  merge,
  help: {
    summary: 'this help; `help COMMAND` for one command (e.g. `help assess`)',
    flags: {},
    run: (args) => {
      const topic = args.positional[0];
      if (topic !== undefined && !(topic in commands))
        throw new UsageError(`no help topic "${topic}"; try \`sure-enough help\``);
      const own = topic !== undefined ? commands[topic]?.help : undefined;
      if (own !== undefined) return own;
      return helpText(
        topic,
        Object.entries(commands).map(([k, c]) => [k, c.summary] as const),
      );
    },
  },
};
