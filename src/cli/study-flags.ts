/**
 * The study flags shared by every command that takes values, turned into an AnalysisSetup. This file only
 * reads the flag text (numbers, `margin:D`, `name:weight` lists) and names the flag when the text cannot be
 * read; whether the setup is valid is decided by the one setup validator (src/model/setup.ts), whose
 * problems are reported here under the flag that sets the field: `flag --sprt-alpha: must be strictly
 * between 0 and 0.5`. Every mistake is a UsageError (exit 2, nothing on stdout). Documented by help.ts.
 */

import { parseStrata } from '../design/strata-spec.ts';
import { SETUP_DEFAULTS, type SetupProblem, setupProblems } from '../model/setup.ts';
import type { AnalysisSetup, Target } from '../model/types.ts';
import { type FlagSpec, UsageError } from './io.ts';

const PLANNING_FLAGS = ['nb-k', 'taylor-a', 'taylor-b', 'iwao-alpha', 'iwao-beta'];
const SPRT_FLAGS = ['sprt-alpha', 'sprt-beta', 'sprt-lower', 'sprt-upper'];

/** The study flags (all take a value); a command adds its own flags to these. */
export const STUDY_FLAGS: FlagSpec = Object.fromEntries(
  [
    'kind',
    'level',
    'sided',
    'method',
    'target',
    'rule',
    'min',
    'hot-spot-share',
    'population',
    'plot-area',
    'max',
    ...PLANNING_FLAGS,
    ...SPRT_FLAGS,
    // field designs (src/design)
    'strata',
    'cost',
    'design',
    'non-detects',
  ].map((name) => [name, 'string' as const]),
);

/** The flag that sets each setup field (the `bundle` command's own flags included). */
const FLAG_OF: Readonly<Record<string, string>> = {
  kind: 'kind',
  level: 'level',
  sided: 'sided',
  method: 'method',
  target: 'target',
  'target.kind': 'target',
  'target.value': 'target',
  rule: 'rule',
  min: 'min',
  hotSpotShare: 'hot-spot-share',
  population: 'population',
  plotArea: 'plot-area',
  max: 'max',
  'planning.negBinomialK': 'nb-k',
  'planning.taylorA': 'taylor-a',
  'planning.taylorB': 'taylor-b',
  'planning.iwaoAlpha': 'iwao-alpha',
  'planning.iwaoBeta': 'iwao-beta',
  'sprt.alpha': 'sprt-alpha',
  'sprt.beta': 'sprt-beta',
  'sprt.lowerBound': 'sprt-lower',
  'sprt.upperBound': 'sprt-upper',
  'sprt.maxN': 'max',
  strata: 'strata',
  design: 'design',
  nonDetects: 'non-detects',
  unit: 'unit',
  plotAreaUnit: 'plot-area-unit',
  outcomeName: 'outcome',
  taxon: 'taxon',
  samplingProtocol: 'protocol',
  reportingLimit: 'reporting-limit',
};

/** The flag to name for a setup problem (a problem of a whole group names the first flag given of it). */
export function flagOf(path: string, flags: ReadonlyMap<string, string>): string {
  const own = FLAG_OF[path];
  if (own !== undefined) return own;
  const stratum = /^strata\[\d+\]\.(\w+)$/.exec(path);
  if (stratum) return stratum[1] === 'cost' ? 'cost' : 'strata';
  if (path.startsWith('strata')) return 'strata';
  if (path === 'planning') return PLANNING_FLAGS.find((f) => flags.has(f)) ?? 'nb-k';
  if (path === 'sprt') return SPRT_FLAGS.find((f) => flags.has(f)) ?? 'sprt-lower';
  return path;
}

/** The validator's problems in the command line's words: `flag --NAME: message`, one per line. */
export function flagProblems(problems: readonly SetupProblem[], flags: ReadonlyMap<string, string>): string {
  return problems.map((q) => `flag --${flagOf(q.path, flags)}: ${q.message}`).join('\n');
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

function number(flags: ReadonlyMap<string, string>, name: string): number | undefined {
  const raw = flags.get(name);
  if (raw === undefined) return undefined;
  if (!NUMBER.test(raw.trim())) throw new UsageError(`flag --${name}: "${raw}" is not a number`);
  return Number(raw.trim());
}

/** A share as a fraction or a percentage: `0.1` and `10%` both mean 10 % (the range is the validator's). */
function share(flags: ReadonlyMap<string, string>, name: string): number | undefined {
  const raw = flags.get(name);
  if (raw === undefined) return undefined;
  const t = raw.trim();
  const s = t.endsWith('%') ? t.slice(0, -1).trim() : t;
  if (!NUMBER.test(s)) throw new UsageError(`flag --${name}: "${raw}" is not a number`);
  return s === t ? Number(s) : Number(s) / 100;
}

/** Parses `margin:D`, `relative:R`, `precision:D` or `limit:L` (the value's range is the validator's). */
export function parseTarget(raw: string, dataKind?: string): Target {
  const m = /^(margin|relative|precision|limit):(.+)$/.exec(raw.trim());
  if (!m)
    throw new UsageError(`flag --target: "${raw}" is not one of margin:D, relative:R, precision:D, limit:L`);
  const kind = m[1] as Target['kind'];
  const typed = m[2]!.trim();
  // `relative:20%` and `relative:0.2` both mean ±20 %; a percent sign divides by 100 (pass/fail margins and
  // limits are proportions too, so `limit:10%` reads as 0.1)
  const percent = typed.endsWith('%');
  const s = percent ? typed.slice(0, -1).trim() : typed;
  if (!NUMBER.test(s)) throw new UsageError(`flag --target: "${typed}" is not a number`);
  if (percent && kind === 'precision')
    throw new UsageError(
      `flag --target: precision is SE/mean as a fraction (e.g. precision:0.1), not "${typed}"`,
    );
  // a measurement's margin or limit is in the data's unit, which may itself be % (moisture, cover)
  if (percent && kind !== 'relative' && dataKind !== 'pass-fail')
    throw new UsageError(
      `flag --target: "${typed}" — a ${kind} is in the data's unit; write the number alone (a percent sign is read only for relative targets and pass/fail proportions)`,
    );
  return { kind, value: percent ? Number(s) / 100 : Number(s) };
}

/** Only the members that were given (the validator reads a missing member as `missing`). */
function given(o: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined));
}

/** The setup the study flags describe, before validation (fields exactly as typed, parsed to numbers). */
export function readStudyFlags(flags: ReadonlyMap<string, string>): Record<string, unknown> {
  const setup: Record<string, unknown> = given({
    kind: flags.get('kind'),
    level: number(flags, 'level') ?? SETUP_DEFAULTS.level,
    sided: flags.get('sided') ?? SETUP_DEFAULTS.sided,
    method: flags.get('method'),
    target: flags.has('target') ? parseTarget(flags.get('target')!, flags.get('kind')) : undefined,
    rule: flags.get('rule') ?? SETUP_DEFAULTS.rule,
    min: number(flags, 'min') ?? SETUP_DEFAULTS.min,
    hotSpotShare: share(flags, 'hot-spot-share') ?? SETUP_DEFAULTS.hotSpotShare,
    population: number(flags, 'population'),
    plotArea: number(flags, 'plot-area'),
    max: number(flags, 'max'),
    design: flags.get('design'),
    nonDetects: flags.get('non-detects'),
  });
  const planning = given({
    negBinomialK: number(flags, 'nb-k'),
    taylorA: number(flags, 'taylor-a'),
    taylorB: number(flags, 'taylor-b'),
    iwaoAlpha: number(flags, 'iwao-alpha'),
    iwaoBeta: number(flags, 'iwao-beta'),
  });
  if (Object.keys(planning).length > 0) setup.planning = planning;
  if (SPRT_FLAGS.some((f) => flags.has(f)))
    setup.sprt = given({
      alpha: number(flags, 'sprt-alpha') ?? SETUP_DEFAULTS.sprtAlpha,
      beta: number(flags, 'sprt-beta') ?? SETUP_DEFAULTS.sprtBeta,
      lowerBound: number(flags, 'sprt-lower'),
      upperBound: number(flags, 'sprt-upper'),
      // the planned maximum is also the test's truncation
      maxN: setup.max,
    });
  const strata = flags.get('strata');
  const cost = flags.get('cost');
  if (cost !== undefined && strata === undefined) throw new UsageError('flag --cost needs --strata');
  if (strata !== undefined) {
    const r = parseStrata(strata, cost);
    if (!r.ok)
      throw new UsageError(`flag --${r.problem.startsWith('cost') ? 'cost' : 'strata'}: ${r.problem}`);
    setup.strata = r.strata;
  }
  return setup;
}

/** The study flags as a valid AnalysisSetup, or a UsageError naming each flag whose value is refused. */
export function parseStudyFlags(flags: ReadonlyMap<string, string>): AnalysisSetup {
  const setup = readStudyFlags(flags);
  const problems = setupProblems(setup);
  if (problems.length > 0) throw new UsageError(flagProblems(problems, flags));
  return setup as unknown as AnalysisSetup;
}
