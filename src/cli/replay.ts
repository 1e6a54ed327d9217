/**
 * `sure-enough replay [FILE|-]`: for each recorded or simulated sequence (JSON lines `{"values":[...]}`),
 * where the stopping rule stops and the interval it reports there (src/cli/README.md, "Output"). One JSON
 * line out per input line: `{"stoppedAt":N|null,"estimate":…,"lower":…,"upper":…,"verdict":…}` —
 * stoppedAt is the first n with a verdict other than `keep going`, or null with the summary at the end of
 * the sequence.
 * Any other input — values, the project's CSV export or a study bundle (input.ts, as `assess` reads them) —
 * is one sequence, its counted entries in log order: one output line, with `setupFrom` saying where the
 * setup came from.
 * Study flags as for `assess` (src/cli/study-flags.ts), `--rule naive|standard|strict|sprt`.
 * Blank lines and lines starting with `#` are skipped (no output line). Any bad line → exit 2 naming it.
 */

import { type PassFailMemo, type ReplayResult, replaySequence } from '../assess/index.ts';
import type { AnalysisSetup } from '../model/types.ts';
import { studyInput } from './input.ts';
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
Any other input is read as assess reads it — values (one per line, or a CSV with a value column), the
CSV export of a study, or a study bundle (its setup used unless study flags replace settings) — and is
one sequence: its counted entries in log order, one output line with "setupFrom" (flags, bundle or
bundle+flags).
Use it to validate a stopping plan on last season's data, or to compare rules on simulated sequences.
`;

const line = (r: ReplayResult) => ({
  stoppedAt: r.stoppedAt,
  estimate: r.estimate,
  lower: r.lower,
  upper: r.upper,
  verdict: r.verdict,
});

/** A JSON-lines input starts with a one-line object (a bundle's first line is a lone "{"). */
function isJsonLines(text: string): boolean {
  const first = text
    .replace(/^\uFEFF/, '')
    .split(/\r\n|\r|\n/)
    .map((l) => l.trim())
    .find((l) => l !== '' && !l.startsWith('#'));
  if (first === undefined) return true; // nothing to read: "no sequences"
  if (!first.startsWith('{')) return false;
  try {
    JSON.parse(first);
    return true;
  } catch {
    return first !== '{';
  }
}

/** One sequence from values, a CSV export or a bundle: designs and non-detects are not replayed. */
async function replayOne(text: string, file: string | undefined, args: ParsedArgs): Promise<string> {
  const input = await studyInput(
    text,
    file === undefined || file === '-' ? 'standard input' : file,
    args.flags,
  );
  const { setup, points } = input;
  if ((setup.strata !== undefined && setup.strata.length > 0) || setup.design !== undefined)
    throw new UsageError(
      `replay does not replay strata or composites (the ${input.setupFrom === 'flags' ? 'flags set' : 'bundle sets'} them); use assess`,
    );
  const designed = points.findIndex((p) => p.stratum !== undefined || p.cluster !== undefined || p.censored);
  if (designed >= 0)
    throw new UsageError(
      `entry ${designed + 1}: replay does not replay strata, primary units or non-detects; use assess`,
    );
  if (setup.population !== undefined && points.length > setup.population)
    throw new UsageError(`${points.length} values but the population is ${setup.population}`);
  const r = replaySequence(
    points.map((p) => p.value),
    setup,
  );
  return `${JSON.stringify({ ...line(r), setupFrom: input.setupFrom })}\n`;
}

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

export async function run(args: ParsedArgs): Promise<string> {
  if (args.positional.length > 1)
    throw new UsageError(
      `replay takes one input (FILE or -), got ${args.positional.length}: ${args.positional.join(' ')}`,
    );
  if (args.flags.has('strata') || args.flags.has('design') || args.flags.has('non-detects'))
    throw new UsageError('replay does not support --strata, --design or --non-detects');
  const text = readInput(args.positional[0]);
  if (!isJsonLines(text)) return replayOne(text, args.positional[0], args);
  const setup = parseStudyFlags(args.flags);
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
    seen++;
    out.push(JSON.stringify(line(replaySequence(values, setup, memo))));
  }
  if (seen === 0) throw new UsageError('no sequences: the input has no {"values":[...]} lines');
  return `${out.join('\n')}\n`;
}
