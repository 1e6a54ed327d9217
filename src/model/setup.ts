/**
 * What a valid study setup is, decided once: the lists of data kinds, interval methods, stopping rules,
 * sidedness, target kinds, designs and non-detect handling, and the one validator every surface calls —
 * the New study form, the command-line study flags, the bundle importer and the core itself. A setup
 * that one surface accepts, every surface accepts; one that it refuses, every surface refuses with the
 * same words. Only the prefix differs: `study.setup.sprt.alpha: …` in a bundle, `flag --sprt-alpha: …` on
 * the command line, the field's label in the form.
 *
 * The value is untrusted (a parsed file, a form, flags): every field is checked for its type, its range
 * and its fit with the rest of the setup, and each problem names the field path inside the setup
 * (`level`, `sprt.alpha`, `strata[2].weight`, `target.value`). Unknown fields are problems too: a
 * setup member this program does not know would be silently ignored by the statistics.
 *
 * Ranges a field practitioner expects, and why:
 * - level and the hot-spot share, strictly between 0 and 1 (a share of 1 would be the whole site); SPRT α and β strictly between 0 and 0.5 (a test that errs half the
 *   time decides nothing; Wald 1947, Sequential Analysis, needs α + β < 1);
 * - the SPRT indifference zone [lowerBound, upperBound] has lowerBound > 0 (every family of the limit
 *   decision — Bernoulli, Poisson, negative binomial, lognormal — is defined for a positive rate or
 *   mean), upperBound < 1 for pass/fail, and surrounds a limit target;
 * - pass/fail targets are proportions: a limit strictly between 0 and 1, a margin below 1;
 * - planning coefficients are for counts only; Taylor's a and b (Taylor 1961, Nature 189:732) go together,
 *   with a > 0 and 0 < b ≤ 5 (b is usually between 1 and 3; the bound only catches a slip); Iwao's α and β (Iwao 1968)
 *   go together, with α > −1 as Kuno's stop line (Kuno 1969) requires;
 * - strata: at least one (a single stratum gives the unstratified mean, a useful check), distinct
 *   non-empty names, weight > 0, effort > 0; a composite design is not combined with strata (Cochran 1977, Sampling Techniques, ch. 5);
 * - non-detects and the reporting limit for measurements only; the plot area for counts only.
 */
import type { StudySetup } from './records.ts';
import {
  DATA_KINDS,
  DESIGNS,
  METHODS_BY_KIND,
  NON_DETECTS,
  RULES,
  SIDEDNESS,
  TARGET_KINDS,
} from './setup-lists.ts';

import type { AnalysisSetup, DataKind, MethodName, Target } from './types.ts';

export * from './setup-lists.ts';

/**
 * Every member of a stored setup, checked by the compiler: a member added to StudySetup without being
 * listed here is a type error, so the validator never refuses (or lets through unchecked) a new field.
 */
const SETUP_MEMBERS: Record<keyof StudySetup, true> = {
  kind: true,
  level: true,
  sided: true,
  method: true,
  target: true,
  rule: true,
  min: true,
  hotSpotShare: true,
  population: true,
  plotArea: true,
  max: true,
  planning: true,
  sprt: true,
  strata: true,
  design: true,
  nonDetects: true,
  unit: true,
  plotAreaUnit: true,
  outcomeName: true,
  taxon: true,
  samplingProtocol: true,
  reportingLimit: true,
  decimalSeparator: true,
  expectedRange: true,
  positionWarnM: true,
  otherOutcomeName: true,
};
export const SETUP_KEYS: readonly (keyof StudySetup)[] = Object.keys(SETUP_MEMBERS) as (keyof StudySetup)[];
const TARGET_KEYS = ['kind', 'value'];
const LIMIT_KEYS = ['kind', 'value', 'source', 'date'];
const SPRT_KEYS = ['alpha', 'beta', 'lowerBound', 'upperBound', 'maxN'];
const PLANNING_KEYS = ['negBinomialK', 'taylorA', 'taylorB', 'iwaoAlpha', 'iwaoBeta'];
const STRATUM_KEYS = ['name', 'weight', 'cost', 'population'];
const TEXT_FIELDS = ['unit', 'plotAreaUnit', 'outcomeName', 'otherOutcomeName', 'taxon', 'samplingProtocol'];

/** One problem: the field path inside the setup (`sprt.alpha`, `strata[2].weight`; '' = the setup itself). */
export interface SetupProblem {
  path: string;
  message: string;
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const isNum = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const isWhole = (n: number) => Number.isInteger(n) && n >= 1;
const show = (v: unknown): string =>
  v === null
    ? 'null'
    : Array.isArray(v)
      ? 'a list'
      : typeof v === 'string'
        ? `"${v.slice(0, 40)}"`
        : typeof v === 'object'
          ? 'an object'
          : String(v);
const isTargetKind = (v: unknown): v is Target['kind'] => TARGET_KINDS.includes(v as Target['kind']);
const oneOf = (xs: readonly string[]) =>
  xs.length === 1 ? xs[0]! : `${xs.slice(0, -1).join(', ')} or ${xs.at(-1)}`;

/** `prefix` + path, for messages: `study.setup` + `strata[1].name`; an empty path names the prefix. */
export function setupPath(prefix: string, path: string): string {
  if (path === '') return prefix;
  if (prefix === '') return path;
  return `${prefix}.${path}`;
}

class Problems {
  readonly list: SetupProblem[] = [];
  add(path: string, message: string): void {
    this.list.push({ path, message });
  }
  unknownKeys(path: string, obj: Obj, known: readonly string[]): void {
    for (const k of Object.keys(obj))
      if (!known.includes(k)) this.add(setupPath(path, k), 'unknown field (not part of a study setup)');
  }
  /** A number that must pass `test` (described by `rule`); true when present and good. */
  number(
    path: string,
    v: unknown,
    o: { required?: boolean; missing?: string; test?: (n: number) => boolean; rule?: string } = {},
  ): v is number {
    if (v === undefined) {
      if (o.required) this.add(path, o.missing ?? 'missing');
      return false;
    }
    if (!isNum(v)) {
      this.add(path, `must be a number, got ${show(v)}`);
      return false;
    }
    if (o.test && !o.test(v)) {
      this.add(path, `must be ${o.rule}`);
      return false;
    }
    return true;
  }
  choice<T extends string>(path: string, v: unknown, allowed: readonly T[], required: boolean): v is T {
    if (v === undefined) {
      if (required) this.add(path, `missing (${oneOf(allowed)})`);
      return false;
    }
    if (typeof v !== 'string' || !allowed.includes(v as T)) {
      this.add(path, `must be ${oneOf(allowed)}, got ${show(v)}`);
      return false;
    }
    return true;
  }
  text(path: string, v: unknown): void {
    if (v !== undefined && typeof v !== 'string') this.add(path, `must be text, got ${show(v)}`);
  }
}

const BETWEEN_0_1 = 'strictly between 0 and 1 (0 % and 100 %)';
const ABOVE_0 = 'greater than 0';
const WHOLE = 'a whole number ≥ 1';

/** Every problem of an untrusted setup value, in field order; empty when the setup is valid. */
export function setupProblems(value: unknown): SetupProblem[] {
  const p = new Problems();
  if (!isObj(value)) {
    p.add('', `must be an object, got ${show(value)}`);
    return p.list;
  }
  const s = value;
  p.unknownKeys('', s, SETUP_KEYS);
  const kind = p.choice('kind', s.kind, DATA_KINDS, true) ? s.kind : undefined;
  p.number('level', s.level, { required: true, test: (n) => n > 0 && n < 1, rule: BETWEEN_0_1 });
  p.choice('sided', s.sided, SIDEDNESS, true);
  if (s.method !== undefined && kind !== undefined) {
    const allowed = METHODS_BY_KIND[kind];
    if (typeof s.method !== 'string' || !allowed.includes(s.method as MethodName))
      p.add('method', `must be ${oneOf(allowed)} for ${kind} data, got ${show(s.method)}`);
  } else if (s.method !== undefined && typeof s.method !== 'string')
    p.add('method', `must be text, got ${show(s.method)}`);
  const target = checkTarget(p, s.target, kind);
  const rule = p.choice('rule', s.rule, RULES, true) ? s.rule : undefined;
  const targetKind = isObj(s.target) ? s.target.kind : undefined;
  if (rule === 'sprt' && (s.target === undefined || (isTargetKind(targetKind) && targetKind !== 'limit')))
    p.add('rule', 'the limit decision (sprt) needs a limit target');
  const min = p.number('min', s.min, { required: true, test: isWhole, rule: WHOLE }) ? s.min : undefined;
  p.number('hotSpotShare', s.hotSpotShare, { test: (n) => n > 0 && n < 1, rule: BETWEEN_0_1 });
  p.number('population', s.population, { test: isWhole, rule: WHOLE });
  if (p.number('plotArea', s.plotArea, { test: (n) => n > 0, rule: ABOVE_0 }) && kind && kind !== 'count')
    p.add('plotArea', 'applies to counts only');
  if (p.number('max', s.max, { test: isWhole, rule: WHOLE }) && min !== undefined && (s.max as number) < min)
    p.add('max', 'must not be below the minimum number of observations before a verdict');
  checkPlanning(p, s.planning, kind);
  if (s.sprt === undefined) {
    if (rule === 'sprt')
      p.add('sprt', 'missing: the limit decision (sprt) needs the two risks and the indifference zone');
  } else checkSprt(p, s.sprt, kind, target);
  const strata = checkStrata(p, s.strata);
  if (p.choice('design', s.design, DESIGNS, false) && strata)
    p.add('design', 'a composite design cannot be combined with strata');
  if (p.choice('nonDetects', s.nonDetects, NON_DETECTS, false) && kind && kind !== 'measurement')
    p.add('nonDetects', 'applies to measurements only');
  // what a reader of the data needs (StudySetup): text, and each for the data kind it describes
  for (const k of TEXT_FIELDS) p.text(k, s[k]);
  if (typeof s.taxon === 'string' && kind && kind !== 'count') p.add('taxon', 'applies to counts only');
  if (typeof s.plotAreaUnit === 'string' && s.plotArea === undefined)
    p.add('plotAreaUnit', 'goes with a plot area (counts)');
  if (
    p.number('reportingLimit', s.reportingLimit, { test: (n) => n > 0, rule: ABOVE_0 }) &&
    kind &&
    kind !== 'measurement'
  )
    p.add('reportingLimit', 'applies to measurements only');
  if (typeof s.otherOutcomeName === 'string' && kind && kind !== 'pass-fail')
    p.add('otherOutcomeName', 'applies to pass/fail only');
  p.choice('decimalSeparator', s.decimalSeparator, ['.', ','], false);
  p.number('positionWarnM', s.positionWarnM, { test: (n) => n > 0, rule: ABOVE_0 });
  checkRange(p, s.expectedRange, kind);
  return p.list;
}

/** The expected range (values to question, never refuse): low below high; a pass/fail item is 0 or 1. */
function checkRange(p: Problems, r: unknown, kind: DataKind | undefined): void {
  if (r !== undefined && !isObj(r)) p.add('expectedRange', `must be an object, got ${show(r)}`);
  if (!isObj(r)) return;
  p.unknownKeys('expectedRange', r, ['low', 'high']);
  if (kind === 'pass-fail') p.add('expectedRange', 'applies to measurements and counts only');
  const lo = p.number('expectedRange.low', r.low);
  if (p.number('expectedRange.high', r.high) && lo && !((r.low as number) < (r.high as number)))
    p.add('expectedRange.high', 'must be above the expected lowest value');
}

function checkTarget(p: Problems, t: unknown, kind: DataKind | undefined): Target | undefined {
  if (t === undefined) return undefined;
  if (!isObj(t)) {
    p.add('target', `must be an object, got ${show(t)}`);
    return undefined;
  }
  p.unknownKeys('target', t, t.kind === 'limit' ? LIMIT_KEYS : TARGET_KEYS);
  const tk = p.choice('target.kind', t.kind, TARGET_KINDS, true) ? t.kind : undefined;
  p.text('target.source', t.source);
  p.text('target.date', t.date);
  const v = t.value;
  if (!p.number('target.value', v, { required: true })) return undefined;
  if (tk === undefined) return undefined;
  if (tk !== 'limit' && !(v > 0)) p.add('target.value', `must be ${ABOVE_0}`);
  else if (tk === 'relative' && v > 1)
    // a bare number above 1 is ambiguous: a fraction (as stored) or a percentage (as people say it)
    p.add(
      'target.value',
      `a relative target is a fraction of the estimate: ${v} would mean ±${v * 100} %; for ±${v} % write ${v / 100} (or ${v}% on the command line)`,
    );
  else if (kind === 'pass-fail' && tk === 'limit' && !(v > 0 && v < 1))
    p.add('target.value', 'must be strictly between 0 and 1 for pass/fail (a proportion: 0 % and 100 %)');
  else if (kind === 'pass-fail' && tk === 'margin' && !(v < 1))
    p.add('target.value', 'must be below 1 for pass/fail (a proportion: 100 percentage points)');
  else return { kind: tk, value: v } as Target;
  return undefined;
}

function checkPlanning(p: Problems, pl: unknown, kind: DataKind | undefined): void {
  if (pl === undefined) return;
  if (!isObj(pl)) {
    p.add('planning', `must be an object, got ${show(pl)}`);
    return;
  }
  p.unknownKeys('planning', pl, PLANNING_KEYS);
  if (kind !== undefined && kind !== 'count') p.add('planning', 'applies to counts only');
  p.number('planning.negBinomialK', pl.negBinomialK, { test: (n) => n > 0, rule: ABOVE_0 });
  p.number('planning.taylorA', pl.taylorA, { test: (n) => n > 0, rule: ABOVE_0 });
  p.number('planning.taylorB', pl.taylorB, {
    test: (n) => n > 0 && n <= 5,
    rule: 'greater than 0 and at most 5',
  });
  p.number('planning.iwaoAlpha', pl.iwaoAlpha, { test: (n) => n > -1, rule: 'greater than −1' });
  p.number('planning.iwaoBeta', pl.iwaoBeta);
  const pair = (a: string, b: string, words: string) => {
    if (pl[a] !== undefined && pl[b] === undefined) p.add(`planning.${b}`, `missing (${words})`);
    if (pl[b] !== undefined && pl[a] === undefined) p.add(`planning.${a}`, `missing (${words})`);
  };
  pair('taylorA', 'taylorB', 'Taylor’s power law needs both a and b');
  pair('iwaoAlpha', 'iwaoBeta', 'Iwao’s regression needs both α and β');
}

function checkSprt(p: Problems, sp: unknown, kind: DataKind | undefined, target: Target | undefined): void {
  if (!isObj(sp)) {
    p.add('sprt', `must be an object, got ${show(sp)}`);
    return;
  }
  p.unknownKeys('sprt', sp, SPRT_KEYS);
  const risk = { required: true, test: (n: number) => n > 0 && n < 0.5, rule: 'strictly between 0 and 0.5' };
  p.number('sprt.alpha', sp.alpha, risk);
  p.number('sprt.beta', sp.beta, risk);
  const lo = p.number('sprt.lowerBound', sp.lowerBound, {
    required: true,
    missing: 'missing (the lower edge of the indifference zone)',
    test: (n) => n > 0,
    rule: ABOVE_0,
  })
    ? sp.lowerBound
    : undefined;
  let hi = p.number('sprt.upperBound', sp.upperBound, {
    required: true,
    missing: 'missing (the upper edge of the indifference zone)',
  })
    ? sp.upperBound
    : undefined;
  if (hi !== undefined && kind === 'pass-fail' && !(hi < 1)) {
    p.add('sprt.upperBound', 'must be below 1 for pass/fail (a proportion: 100 %)');
    hi = undefined;
  }
  if (lo !== undefined && hi !== undefined && !(lo < hi))
    p.add('sprt.upperBound', 'must be above the lower edge of the indifference zone');
  else if (target?.kind === 'limit') {
    if (lo !== undefined && !(lo < target.value))
      p.add('sprt.lowerBound', 'must be below the limit (the indifference zone surrounds the limit)');
    if (hi !== undefined && !(hi > target.value))
      p.add('sprt.upperBound', 'must be above the limit (the indifference zone surrounds the limit)');
  }
  p.number('sprt.maxN', sp.maxN, { test: isWhole, rule: WHOLE });
}

function checkStrata(p: Problems, strata: unknown): boolean {
  if (strata === undefined) return false;
  if (!Array.isArray(strata)) {
    p.add('strata', `must be a list, got ${show(strata)}`);
    return true;
  }
  if (strata.length === 0) p.add('strata', 'must declare at least one stratum (leave them out for none)');
  const names = new Set<string>();
  strata.forEach((st: unknown, i) => {
    const w = `strata[${i}]`;
    if (!isObj(st)) {
      p.add(w, `must be an object, got ${show(st)}`);
      return;
    }
    p.unknownKeys(w, st, STRATUM_KEYS);
    if (st.name === undefined) p.add(`${w}.name`, 'missing');
    else if (typeof st.name !== 'string') p.add(`${w}.name`, `must be text, got ${show(st.name)}`);
    else if (st.name.trim() === '') p.add(`${w}.name`, 'must not be empty');
    else if (names.has(st.name)) p.add(`${w}.name`, `"${st.name}" is listed twice`);
    else names.add(st.name);
    // the command line and the form show the strata as one text: the message names the stratum
    const of = typeof st.name === 'string' && st.name.trim() !== '' ? ` (stratum "${st.name}")` : '';
    p.number(`${w}.weight`, st.weight, { required: true, test: (n) => n > 0, rule: ABOVE_0 + of });
    p.number(`${w}.cost`, st.cost, { test: (n) => n > 0, rule: ABOVE_0 + of });
    p.number(`${w}.population`, st.population, { test: isWhole, rule: WHOLE + of });
  });
  return true;
}

/** The setup, typed, or every problem with it. */
export function validSetup(
  value: unknown,
): { ok: true; setup: StudySetup } | { ok: false; problems: SetupProblem[] } {
  const problems = setupProblems(value);
  return problems.length === 0 ? { ok: true, setup: value as StudySetup } : { ok: false, problems };
}

/**
 * For the core: a setup that reaches the statistics is valid, or this throws a RangeError naming the
 * first problem (`sprt.alpha: must be strictly between 0 and 0.5`) — a caller's mistake, since every
 * surface that takes a setup from a person or a file has already checked it with setupProblems.
 */
export function assertSetup(setup: unknown): asserts setup is AnalysisSetup {
  const first = setupProblems(setup)[0];
  if (first !== undefined) throw new RangeError(`${first.path || 'setup'}: ${first.message}`);
}
