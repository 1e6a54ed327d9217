/**
 * `sure-enough assess [FILE|-]`: reads values (one per line, or a CSV with a value column), the project's
 * own CSV export or a study bundle (input.ts), assesses them with the same core the app uses (src/assess/)
 * and prints one JSON object (src/cli/README.md, "Output"); `setupFrom` says whether the setup came from
 * the flags, the bundle, or the bundle with flags replacing some settings.
 */
import { assess } from '../assess/index.ts';
import { readStudyInput } from './input.ts';
import { type ParsedArgs, UsageError } from './io.ts';
import { STUDY_FLAGS } from './study-flags.ts';

export const summary = 'interval, verdict and how many more for a list of values';

export const flags = STUDY_FLAGS;

export async function run(args: ParsedArgs): Promise<string> {
  if (args.positional.length > 1)
    throw new UsageError(
      `assess takes one input (FILE or -), got ${args.positional.length}: ${args.positional.join(' ')}`,
    );
  const { points, setup, setupFrom, source } = await readStudyInput(args.positional[0], args.flags);
  if (setup.population !== undefined && points.length > setup.population)
    throw new UsageError(
      `${setupFrom === 'bundle' ? "the bundle's population" : 'flag --population'}: ${points.length} values were given but the population has only ${setup.population} units`,
    );
  const a = assess(points, setup);
  const out = {
    kind: a.kind,
    n: a.n,
    estimate: a.estimate,
    lower: a.lower,
    upper: a.upper,
    level: a.level,
    sided: a.sided,
    method: a.method,
    verdict: a.verdict.status,
    reason: a.verdict.message,
    more: a.more,
    methodLabel: a.methodLabel,
    reasonCode: a.verdict.status === 'keep going' ? a.verdict.reason : null,
    details: a.details,
    warnings: a.warnings,
    setupFrom,
    input: source,
  };
  return `${JSON.stringify(out)}\n`;
}
