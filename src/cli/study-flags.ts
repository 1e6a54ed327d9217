/**
 * The study flags shared by every command that takes values (src/cli/README.md, "Study flags"), parsed
 * into an AnalysisSetup. Every mistake is a UsageError naming the flag (exit 2, nothing on stdout).
 * Documented in full by help.ts.
 */

import { parseStrata } from '../design/strata-spec.ts';
import type {
  AnalysisSetup,
  CountMethod,
  DataKind,
  MeasurementMethod,
  MethodName,
  PassFailMethod,
  RuleName,
  Sided,
  Target,
} from '../model/types.ts';
import { UsageError } from './io.ts';

export const KINDS: readonly DataKind[] = ['measurement', 'count', 'pass-fail'];
export const METHODS_BY_KIND: Record<DataKind, readonly MethodName[]> = {
  measurement: ['t', 'cox', 'land', 'chebyshev'] satisfies MeasurementMethod[],
  count: ['t', 'poisson-exact', 'quasi-poisson'] satisfies CountMethod[],
  'pass-fail': [
    'wilson',
    'wilson-cc',
    'jeffreys',
    'clopper-pearson',
    'agresti-coull',
  ] satisfies PassFailMethod[],
};
export const RULES: readonly RuleName[] = ['standard', 'strict', 'sprt', 'naive'];

/** Flags parsed by parseStudyFlags (a command adds its own flags to the allowed set). */
export const STUDY_FLAGS: readonly string[] = [
  'kind',
  'level',
  'sided',
  'method',
  'target',
  'rule',
  'min',
  'population',
  'plot-area',
  'max',
  'nb-k',
  'taylor-a',
  'taylor-b',
  'iwao-alpha',
  'iwao-beta',
  'sprt-alpha',
  'sprt-beta',
  'sprt-lower',
  'sprt-upper',
  // field designs (issue 7, src/design)
  'strata',
  'cost',
  'design',
  'non-detects',
];

/** Throws a UsageError naming the first flag that is neither a study flag nor in `extra`. */
export function rejectUnknownFlags(flags: Map<string, string>, extra: readonly string[] = []): void {
  for (const name of flags.keys())
    if (!STUDY_FLAGS.includes(name) && !extra.includes(name))
      throw new UsageError(`unknown flag --${name}; see \`sure-enough help\``);
}

function number(flags: Map<string, string>, name: string): number | undefined {
  const raw = flags.get(name);
  if (raw === undefined) return undefined;
  const s = raw.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s))
    throw new UsageError(`flag --${name}: "${raw}" is not a number`);
  return Number(s);
}

function positive(flags: Map<string, string>, name: string): number | undefined {
  const v = number(flags, name);
  if (v !== undefined && !(v > 0)) throw new UsageError(`flag --${name}: must be above 0 (got ${v})`);
  return v;
}

function integer(flags: Map<string, string>, name: string, min: number): number | undefined {
  const v = number(flags, name);
  if (v !== undefined && !(Number.isInteger(v) && v >= min))
    throw new UsageError(`flag --${name}: must be a whole number ≥ ${min} (got ${flags.get(name)})`);
  return v;
}

function probability(flags: Map<string, string>, name: string): number | undefined {
  const v = number(flags, name);
  if (v !== undefined && !(v > 0 && v < 1))
    throw new UsageError(`flag --${name}: must be strictly between 0 and 1 (got ${flags.get(name)})`);
  return v;
}

/** Parses `margin:D`, `relative:R`, `precision:D` or `limit:L`. */
export function parseTarget(raw: string): Target {
  const m = /^(margin|relative|precision|limit):(.+)$/.exec(raw.trim());
  if (!m)
    throw new UsageError(`flag --target: "${raw}" is not one of margin:D, relative:R, precision:D, limit:L`);
  const kind = m[1] as Target['kind'];
  const s = m[2]!.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(s))
    throw new UsageError(`flag --target: "${s}" is not a number`);
  const value = Number(s);
  if (kind !== 'limit' && !(value > 0))
    throw new UsageError(`flag --target: the ${kind} value must be above 0`);
  return { kind, value };
}

export function parseStudyFlags(flags: Map<string, string>): AnalysisSetup {
  const kind = flags.get('kind');
  if (kind === undefined) throw new UsageError('flag --kind is required: measurement, count or pass-fail');
  if (!KINDS.includes(kind as DataKind))
    throw new UsageError(`flag --kind: "${kind}" is not one of measurement, count, pass-fail`);
  const dataKind = kind as DataKind;
  const level = probability(flags, 'level') ?? 0.95;
  const sidedRaw = flags.get('sided');
  if (sidedRaw !== undefined && !['two', 'upper', 'lower'].includes(sidedRaw))
    throw new UsageError(`flag --sided: "${sidedRaw}" is not one of two, upper, lower`);
  const sided = (sidedRaw ?? 'two') as Sided;
  const setup: AnalysisSetup = { kind: dataKind, level, sided, rule: 'standard', min: 10 };
  const method = flags.get('method');
  if (method !== undefined) {
    if (!METHODS_BY_KIND[dataKind].includes(method as MethodName))
      throw new UsageError(
        `flag --method: "${method}" is not a ${dataKind} method; use one of ${METHODS_BY_KIND[dataKind].join(', ')}`,
      );
    setup.method = method as MethodName;
  }
  const target = flags.get('target');
  if (target !== undefined) {
    setup.target = parseTarget(target);
    if (
      dataKind === 'pass-fail' &&
      setup.target.kind === 'limit' &&
      !(setup.target.value > 0 && setup.target.value < 1)
    )
      throw new UsageError('flag --target: a pass-fail limit is a proportion strictly between 0 and 1');
    if (dataKind === 'pass-fail' && setup.target.kind === 'margin' && !(setup.target.value < 1))
      throw new UsageError('flag --target: a pass-fail margin is a proportion below 1');
  }
  const rule = flags.get('rule');
  if (rule !== undefined) {
    if (!RULES.includes(rule as RuleName))
      throw new UsageError(`flag --rule: "${rule}" is not one of ${RULES.join(', ')}`);
    setup.rule = rule as RuleName;
  }
  const min = integer(flags, 'min', 1);
  if (min !== undefined) setup.min = min;
  const population = integer(flags, 'population', 1);
  if (population !== undefined) setup.population = population;
  const plotArea = positive(flags, 'plot-area');
  if (plotArea !== undefined) {
    if (dataKind !== 'count') throw new UsageError('flag --plot-area applies to counts only (--kind count)');
    setup.plotArea = plotArea;
  }
  const max = integer(flags, 'max', 1);
  if (max !== undefined) setup.max = max;
  const k = positive(flags, 'nb-k');
  const a = positive(flags, 'taylor-a');
  const b = number(flags, 'taylor-b');
  const ia = number(flags, 'iwao-alpha');
  const ib = number(flags, 'iwao-beta');
  if ((a === undefined) !== (b === undefined))
    throw new UsageError(
      `flag --${a === undefined ? 'taylor-a' : 'taylor-b'} is needed too: Taylor's a and b go together`,
    );
  if ((ia === undefined) !== (ib === undefined))
    throw new UsageError(
      `flag --${ia === undefined ? 'iwao-alpha' : 'iwao-beta'} is needed too: Iwao's α and β go together`,
    );
  if (k !== undefined || a !== undefined || ia !== undefined) {
    if (dataKind !== 'count')
      throw new UsageError('flags --nb-k, --taylor-a/-b and --iwao-alpha/-beta apply to counts only');
    setup.planning = {
      ...(k !== undefined ? { negBinomialK: k } : {}),
      ...(a !== undefined && b !== undefined ? { taylorA: a, taylorB: b } : {}),
      ...(ia !== undefined && ib !== undefined ? { iwaoAlpha: ia, iwaoBeta: ib } : {}),
    };
  }
  const sa = probability(flags, 'sprt-alpha');
  const sb = probability(flags, 'sprt-beta');
  const sl = number(flags, 'sprt-lower');
  const su = number(flags, 'sprt-upper');
  if (sa !== undefined || sb !== undefined || sl !== undefined || su !== undefined) {
    if (sl === undefined || su === undefined)
      throw new UsageError(
        `flag --${sl === undefined ? 'sprt-lower' : 'sprt-upper'} is needed: the SPRT needs both bounds`,
      );
    if (!(sl < su)) throw new UsageError('flag --sprt-lower must be below --sprt-upper');
    setup.sprt = { alpha: sa ?? 0.05, beta: sb ?? 0.1, lowerBound: sl, upperBound: su };
    if (setup.max !== undefined) setup.sprt.maxN = setup.max;
  }
  parseDesignFlags(flags, setup);
  if (setup.rule === 'sprt' && setup.target?.kind !== 'limit')
    throw new UsageError('flag --rule sprt needs a limit target (--target limit:L)');
  return setup;
}

/** Field-design flags (issue 7): --strata, --cost, --design composite, --non-detects. */
function parseDesignFlags(flags: Map<string, string>, setup: AnalysisSetup): void {
  const strata = flags.get('strata');
  const cost = flags.get('cost');
  if (cost !== undefined && strata === undefined) throw new UsageError('flag --cost needs --strata');
  if (strata !== undefined) {
    const r = parseStrata(strata, cost);
    if (!r.ok)
      throw new UsageError(`flag --${r.problem.startsWith('cost') ? 'cost' : 'strata'}: ${r.problem}`);
    setup.strata = r.strata;
  }
  const design = flags.get('design');
  if (design !== undefined) {
    if (design !== 'composite') throw new UsageError(`flag --design: "${design}" is not composite`);
    if (strata !== undefined)
      throw new UsageError('flag --design composite cannot be combined with --strata');
    setup.design = 'composite';
  }
  const nd = flags.get('non-detects');
  if (nd !== undefined) {
    if (nd !== 'kaplan-meier' && nd !== 'half-limit')
      throw new UsageError(`flag --non-detects: "${nd}" is not one of kaplan-meier, half-limit`);
    if (setup.kind !== 'measurement') throw new UsageError('flag --non-detects applies to measurements only');
    setup.nonDetects = nd;
  }
}
