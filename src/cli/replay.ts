/**
 * `sure-enough replay [FILE|-]`: for each recorded or simulated sequence (JSON lines `{"values":[...]}`),
 * where the stopping rule stops and the interval it reports there (src/cli/README.md, "Output"). One JSON
 * line out per input line: `{"stoppedAt":N|null,"estimate":…,"lower":…,"upper":…,"verdict":…}` —
 * stoppedAt is the first n with a verdict other than `keep going`, or null with the summary at the end of
 * the sequence.
 * Study flags as for `assess` (src/cli/study-flags.ts), `--rule naive|standard|strict|sprt`.
 * Blank lines and lines starting with `#` are skipped (no output line). Any bad line → exit 2 naming it.
 */

import { type PassFailMemo, replaySequence } from '../assess/index.ts';
import type { AnalysisSetup } from '../model/types.ts';
import { type ParsedArgs, readInput, UsageError } from './io.ts';
import { parseStudyFlags, STUDY_FLAGS } from './study-flags.ts';

export const summary = 'where a stopping rule stops on each sequence (JSON lines {"values":[…]})';

export const help = `usage: sure-enough replay [FILE|-] --kind KIND [study flags] [--rule naive|standard|strict|sprt]

Reads JSON lines, each {"values":[v1, v2, …]} — a recorded or simulated sequence in entry order —
and prints one JSON line per input line:
  {"stoppedAt":N|null,"estimate":…,"lower":…,"upper":…,"verdict":"…"}
stoppedAt is the first n at which the rule gives a verdict other than "keep going", with the interval
it reports there; null when it never stops, with the figures at the end of the sequence. lower/upper
are null on the open side of a one-sided bound. Blank lines and lines starting with # are skipped.
Values: numbers (measurement), whole numbers ≥ 0 (count), 0 or 1 (pass-fail).
Study flags as for assess (see \`sure-enough help\`); strata, composites and non-detects are not replayed.
Use it to validate a stopping plan on last season's data, or to compare rules on simulated sequences.
`;

function validate(values: unknown, lineNo: number, setup: AnalysisSetup): number[] {
  if (!Array.isArray(values)) throw new UsageError(`line ${lineNo}: "values" must be an array of numbers`);
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    const where = `line ${lineNo}, value ${i + 1}`;
    if (typeof v !== 'number' || !Number.isFinite(v))
      throw new UsageError(`${where}: ${JSON.stringify(v)} is not a number`);
    if (setup.kind === 'count' && !(Number.isInteger(v) && v >= 0))
      throw new UsageError(`${where}: a count must be a whole number ≥ 0 (got ${v})`);
    if (setup.kind === 'pass-fail' && v !== 0 && v !== 1)
      throw new UsageError(`${where}: a pass-fail value must be 0 or 1 (got ${v})`);
  }
  if (setup.population !== undefined && values.length > setup.population)
    throw new UsageError(`line ${lineNo}: ${values.length} values but --population is ${setup.population}`);
  return values as number[];
}

export const flags = STUDY_FLAGS;

export function run(args: ParsedArgs): string {
  if (args.positional.length > 1)
    throw new UsageError(
      `replay takes one input (FILE or -), got ${args.positional.length}: ${args.positional.join(' ')}`,
    );
  const setup = parseStudyFlags(args.flags);
  if (setup.strata !== undefined || setup.design !== undefined || setup.nonDetects !== undefined)
    throw new UsageError('replay does not support --strata, --design or --non-detects');
  const text = readInput(args.positional[0]);
  const lines = text.split(/\r?\n/);
  const out: string[] = [];
  const memo: PassFailMemo = new Map();
  let seen = 0;
  for (let i = 0; i < lines.length; i++) {
    const raw = (lines[i] as string).trim();
    if (raw === '' || raw.startsWith('#')) continue;
    const lineNo = i + 1;
    let obj: unknown;
    try {
      obj = JSON.parse(raw);
    } catch (err) {
      throw new UsageError(`line ${lineNo}: not valid JSON (${(err as Error).message})`);
    }
    if (obj === null || typeof obj !== 'object' || Array.isArray(obj) || !('values' in obj))
      throw new UsageError(`line ${lineNo}: expected an object {"values":[...]}`);
    const values = validate((obj as { values: unknown }).values, lineNo, setup);
    const r = replaySequence(values, setup, memo);
    seen++;
    out.push(
      JSON.stringify({
        stoppedAt: r.stoppedAt,
        estimate: r.estimate,
        lower: r.lower,
        upper: r.upper,
        verdict: r.verdict,
      }),
    );
  }
  if (seen === 0) throw new UsageError('no sequences: the input has no {"values":[...]} lines');
  return `${out.join('\n')}\n`;
}
