/**
 * `sure-enough assess [FILE|-]`: reads values (one per line, or a CSV with a `value` column), assesses them
 * with the same core the app uses (src/assess/) and prints one JSON object (src/cli/README.md, "Output").
 */
import { assess } from '../assess/index.ts';
import { parseValues } from '../validate/parse-values.ts';
import { type ParsedArgs, readInput, UsageError } from './io.ts';
import { parseStudyFlags, STUDY_FLAGS } from './study-flags.ts';

export const summary = 'interval, verdict and how many more for a list of values';

export const flags = STUDY_FLAGS;

export function run(args: ParsedArgs): string {
  if (args.positional.length > 1)
    throw new UsageError(
      `assess takes one input (FILE or -), got ${args.positional.length}: ${args.positional.join(' ')}`,
    );
  const setup = parseStudyFlags(args.flags);
  const text = readInput(args.positional[0]);
  const parsed = parseValues(text, setup.kind);
  if (!parsed.ok) throw new UsageError(parsed.errors.join('\n'));
  if (setup.population !== undefined && parsed.points.length > setup.population)
    throw new UsageError(
      `flag --population: ${parsed.points.length} values were given but the population has only ${setup.population} units`,
    );
  const a = assess(parsed.points, setup);
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
  };
  return `${JSON.stringify(out)}\n`;
}
