/**
 * What `assess` and `replay` read, besides JSON lines: values (one per line, or a CSV with a value column),
 * the project's own CSV export (src/export/csv.ts; its value column found by its name, only counted rows),
 * or a study bundle (src/bundle/SCHEMA.md) with its setup. The setup comes from the bundle unless study
 * flags are given, and then each flag given replaces the one setting it sets (the rest stay the
 * bundle's, a stratum's number of units included, which no flag carries); `setupFrom` says which.
 */
import type { Bundle } from '../bundle/bundle.ts';
import { pointsOf } from '../bundle/events.ts';
import { parseBundle } from '../bundle/validate.ts';
import { setupProblems } from '../model/setup.ts';
import type { AnalysisSetup, Point } from '../model/types.ts';
import { parseValues, type ValueTable } from '../validate/parse-values.ts';
import { findTable } from '../validate/value-columns.ts';
import { readInput, UsageError } from './io.ts';
import { flagProblems, parseStudyFlags, readStudyFlags, STUDY_FLAGS } from './study-flags.ts';

export type SetupFrom = 'flags' | 'bundle' | 'bundle+flags';

export interface StudyInput {
  points: Point[];
  setup: AnalysisSetup;
  setupFrom: SetupFrom;
  /** `lines` (one value per line), `csv`, `export` (the project's CSV export) or `bundle`. */
  source: ValueTable['format'] | 'bundle';
  /** The bundle, when one was read. */
  bundle?: Bundle;
}

/** The setting (path in the setup) each study flag sets; `cost` goes with `strata`. */
const SETTING_OF: Readonly<Record<string, string>> = {
  kind: 'kind',
  level: 'level',
  sided: 'sided',
  method: 'method',
  target: 'target',
  rule: 'rule',
  min: 'min',
  population: 'population',
  'plot-area': 'plotArea',
  max: 'max',
  'nb-k': 'planning.negBinomialK',
  'taylor-a': 'planning.taylorA',
  'taylor-b': 'planning.taylorB',
  'iwao-alpha': 'planning.iwaoAlpha',
  'iwao-beta': 'planning.iwaoBeta',
  'sprt-alpha': 'sprt.alpha',
  'sprt-beta': 'sprt.beta',
  'sprt-lower': 'sprt.lowerBound',
  'sprt-upper': 'sprt.upperBound',
  strata: 'strata',
  cost: 'strata',
  design: 'design',
  'non-detects': 'nonDetects',
};

type Obj = Record<string, unknown>;

function setPath(target: Obj, path: string, value: unknown): void {
  const [head, member] = path.split('.') as [string, string | undefined];
  if (member === undefined) {
    if (value === undefined) delete target[head];
    else target[head] = value;
    return;
  }
  const inner: Obj = { ...((target[head] as Obj | undefined) ?? {}) };
  if (value === undefined) delete inner[member];
  else inner[member] = value;
  target[head] = inner;
}

function getPath(source: Obj, path: string): unknown {
  const [head, member] = path.split('.') as [string, string | undefined];
  const v = source[head];
  return member === undefined ? v : (v as Obj | undefined)?.[member];
}

/** The bundle's setup with each given study flag's setting replaced, checked by the one validator. */
function mergedSetup(bundle: Bundle, flags: ReadonlyMap<string, string>): AnalysisSetup {
  const own = bundle.study.setup;
  const given = [...flags.keys()].filter((f) => f in STUDY_FLAGS);
  if (given.length === 0) return own;
  if (flags.has('kind') && flags.get('kind') !== own.kind)
    throw new UsageError(`flag --kind: the bundle holds ${own.kind} data; --kind cannot change it`);
  const typed = readStudyFlags(new Map([...flags, ['kind', own.kind]]));
  const setup: Obj = JSON.parse(JSON.stringify(own));
  for (const f of given) {
    const path = SETTING_OF[f]!;
    setPath(setup, path, getPath(typed, path));
    // the planned maximum is also the SPRT's truncation (as the flags set it without a bundle)
    if (f === 'max' && setup.sprt !== undefined) setPath(setup, 'sprt.maxN', typed.max);
  }
  const problems = setupProblems(setup);
  if (problems.length > 0) throw new UsageError(flagProblems(problems, flags));
  return setup as unknown as AnalysisSetup;
}

const looksLikeJson = (text: string) =>
  text
    .replace(/^\uFEFF/, '')
    .trimStart()
    .startsWith('{');

/**
 * Reads FILE (or standard input) as a study bundle when it is a JSON object, else as values; builds the
 * setup from the bundle and the flags, or from the flags alone. Every problem is a UsageError naming the
 * line, the field or the flag.
 */
export function readStudyInput(
  file: string | undefined,
  flags: ReadonlyMap<string, string>,
): Promise<StudyInput> {
  return studyInput(readInput(file), file === undefined || file === '-' ? 'standard input' : file, flags);
}

/** readStudyInput on text already read (`name` names it in messages). */
export async function studyInput(
  text: string,
  name: string,
  flags: ReadonlyMap<string, string>,
): Promise<StudyInput> {
  if (looksLikeJson(text)) {
    const result = await parseBundle(text.replace(/^\uFEFF/, ''));
    if (!result.ok)
      throw new UsageError(`${name}: not a valid study bundle:\n  ${result.problems.join('\n  ')}`);
    const bundle = result.bundle;
    const setup = mergedSetup(bundle, flags);
    const given = [...flags.keys()].some((f) => f in STUDY_FLAGS);
    const points = pointsOf(bundle.events);
    if (points.length === 0) throw new UsageError(`${name}: the bundle holds no counted entries`);
    return { points, setup, setupFrom: given ? 'bundle+flags' : 'bundle', source: 'bundle', bundle };
  }
  // values: a CSV whose value column names its data kind (the export's count_per_plot, outcome_1_or_0,
  // value_<unit>) supplies --kind when it is not given
  let studyFlags = flags;
  if (!flags.has('kind')) {
    const found = findTable(text);
    if (found.ok && found.table.kind !== undefined)
      studyFlags = new Map([...flags, ['kind', found.table.kind]]);
  }
  const setup = parseStudyFlags(studyFlags);
  const parsed = parseValues(text, setup.kind);
  if (!parsed.ok) throw new UsageError(parsed.errors.join('\n'));
  const source = parsed.table.format;
  return { points: parsed.points, setup, setupFrom: 'flags', source };
}
