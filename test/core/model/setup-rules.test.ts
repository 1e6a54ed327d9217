// Each setup rule through all four surfaces that take a setup — the New study form (buildSetup), the
// command line (`sure-enough assess`, built by npm run build:cli), the bundle importer (parseBundle of a
// bundle whose setup holds the value, checksum made for it) and the core (assertSetup) — which must all
// accept it, or all refuse it with the same words, each under its own prefix:
//   form          "<label>: <message>" under the field that sets the value
//   command line  "flag --<flag>: <message>" on stderr, exit code 2, nothing on stdout
//   bundle        "study.setup.<path>: <message>"
//   core          RangeError "<path>: <message>"
// Where a surface cannot express a setup (the form has no Iwao or design fields), the case says so.
// Each rule names its source; the SPRT α edge (0.5 refused, 0.4999 accepted) is Wald 1947, Sequential
// Analysis, §3.2 (boundaries A = (1 − β)/α, B = β/(1 − α) need α + β < 1; the rule α, β < 0.5 is the
// practitioner's) [read/secondary].
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { makeBundle, serializeBundle } from '../../../src/bundle/bundle.ts';
import { parseBundle } from '../../../src/bundle/validate.ts';
import type { StudySetup } from '../../../src/model/records.ts';
import { assertSetup } from '../../../src/model/setup.ts';
import { buildSetup, EMPTY, type Form } from '../../../web/app/screens/new-study-form.ts';
import { entries, study } from '../bundle/make.ts';

const root = join(import.meta.dirname, '..', '..', '..');
const bin = join(root, 'src', 'cli', 'bin.mjs');

interface Base {
  form: Form;
  flags: Record<string, string>;
  setup: StudySetup;
}
const common = { level: 0.95, sided: 'two', rule: 'standard', min: 10, hotSpotShare: 0.1 } as const;
const S = { alpha: 0.05, beta: 0.1, lowerBound: 0.02, upperBound: 0.08 };
const LIMIT = { kind: 'limit', value: 0.05, source: 'permit 12', date: '2026-01-01' } as const;
const BASES: Record<'m' | 'c' | 'pf' | 'pfs', Base> = {
  m: {
    form: { ...EMPTY, name: 'Rules', kind: 'measurement', unit: 'mg/kg', targetValue: '2', ack: true },
    flags: { kind: 'measurement', target: 'margin:2' },
    setup: { kind: 'measurement', ...common, target: { kind: 'margin', value: 2 }, unit: 'mg/kg' },
  },
  c: {
    form: { ...EMPTY, name: 'Rules', kind: 'count', targetKind: 'precision', targetValue: '0.2', ack: true },
    flags: { kind: 'count', target: 'precision:0.2', 'plot-area': '1' },
    setup: {
      kind: 'count',
      ...common,
      target: { kind: 'precision', value: 0.2 },
      unit: '1',
      plotArea: 1,
      plotAreaUnit: 'm2',
    },
  },
  pf: {
    form: { ...EMPTY, name: 'Rules', kind: 'pass-fail', outcome: 'defect', targetValue: '5', ack: true },
    flags: { kind: 'pass-fail', target: 'margin:0.05' },
    setup: { kind: 'pass-fail', ...common, target: { kind: 'margin', value: 0.05 }, outcomeName: 'defect' },
  },
  pfs: {
    form: {
      ...EMPTY,
      name: 'Rules',
      kind: 'pass-fail',
      outcome: 'defect',
      targetKind: 'limit',
      targetValue: '5',
      limitSource: LIMIT.source,
      limitDate: LIMIT.date,
      rule: 'sprt',
      sprtLow: '2',
      sprtHigh: '8',
      ack: true,
    },
    flags: {
      kind: 'pass-fail',
      target: 'limit:0.05',
      rule: 'sprt',
      'sprt-alpha': '0.05',
      'sprt-beta': '0.1',
      'sprt-lower': '0.02',
      'sprt-upper': '0.08',
    },
    setup: { kind: 'pass-fail', ...common, rule: 'sprt', target: LIMIT, outcomeName: 'defect', sprt: S },
  },
};

interface Refusal {
  path: string;
  message: string;
  flag: string;
  /** The form field that shows it; null with the reason when the form cannot express the setup. */
  field: keyof Form | null;
}
interface Case {
  rule: string;
  base: keyof typeof BASES;
  /** Form fields changed, or why the form cannot express this setup. */
  form: Partial<Form> | string;
  /** Flags changed (null removes one). */
  flags: Record<string, string | null>;
  setup: Partial<Record<keyof StudySetup, unknown>>;
  /** Values for `assess` when the setup is accepted (default one value). */
  input?: string;
  refused?: Refusal;
}

const BETWEEN_0_1 = 'must be strictly between 0 and 1 (0 % and 100 %)';
const RISK = 'must be strictly between 0 and 0.5';
const WHOLE = 'must be a whole number ≥ 1';
const ABOVE_0 = 'must be greater than 0';
const NO_FORM_DESIGN = 'the form has no design, non-detect or Iwao fields';

const CASES: Case[] = [
  // Wald 1947 §3.2 (see the file comment)
  {
    rule: 'SPRT α 0.5 (the edge)',
    base: 'pfs',
    form: { sprtAlpha: '0.5' },
    flags: { 'sprt-alpha': '0.5' },
    setup: { sprt: { ...S, alpha: 0.5 } },
    refused: { path: 'sprt.alpha', message: RISK, flag: 'sprt-alpha', field: 'sprtAlpha' },
  },
  {
    rule: 'SPRT α 0.4999 (just below the edge)',
    base: 'pfs',
    form: { sprtAlpha: '0.4999' },
    flags: { 'sprt-alpha': '0.4999' },
    setup: { sprt: { ...S, alpha: 0.4999 } },
    input: '0\n',
  },
  {
    rule: 'SPRT α 0',
    base: 'pfs',
    form: { sprtAlpha: '0' },
    flags: { 'sprt-alpha': '0' },
    setup: { sprt: { ...S, alpha: 0 } },
    refused: { path: 'sprt.alpha', message: RISK, flag: 'sprt-alpha', field: 'sprtAlpha' },
  },
  {
    rule: 'SPRT β 0.5',
    base: 'pfs',
    form: { sprtBeta: '0.5' },
    flags: { 'sprt-beta': '0.5' },
    setup: { sprt: { ...S, beta: 0.5 } },
    refused: { path: 'sprt.beta', message: RISK, flag: 'sprt-beta', field: 'sprtBeta' },
  },
  // Bernoulli SPRT needs 0 < θ₀ < θ₁ < 1 (Wald 1947, ch. 5); the zone surrounds the limit
  {
    rule: 'indifference zone starting above the limit',
    base: 'pfs',
    form: { sprtLow: '6' },
    flags: { 'sprt-lower': '0.06' },
    setup: { sprt: { ...S, lowerBound: 0.06 } },
    refused: {
      path: 'sprt.lowerBound',
      message: 'must be below the limit (the indifference zone surrounds the limit)',
      flag: 'sprt-lower',
      field: 'sprtLow',
    },
  },
  {
    rule: 'indifference zone edges reversed',
    base: 'pfs',
    form: { sprtLow: '8', sprtHigh: '2' },
    flags: { 'sprt-lower': '0.08', 'sprt-upper': '0.02' },
    setup: { sprt: { ...S, lowerBound: 0.08, upperBound: 0.02 } },
    refused: {
      path: 'sprt.upperBound',
      message: 'must be above the lower edge of the indifference zone',
      flag: 'sprt-upper',
      field: 'sprtHigh',
    },
  },
  {
    rule: 'indifference zone from 0',
    base: 'pfs',
    form: { sprtLow: '0' },
    flags: { 'sprt-lower': '0' },
    setup: { sprt: { ...S, lowerBound: 0 } },
    refused: { path: 'sprt.lowerBound', message: ABOVE_0, flag: 'sprt-lower', field: 'sprtLow' },
  },
  {
    rule: 'indifference zone up to 100 % for pass/fail',
    base: 'pfs',
    form: { sprtHigh: '100' },
    flags: { 'sprt-upper': '1' },
    setup: { sprt: { ...S, upperBound: 1 } },
    refused: {
      path: 'sprt.upperBound',
      message: 'must be below 1 for pass/fail (a proportion: 100 %)',
      flag: 'sprt-upper',
      field: 'sprtHigh',
    },
  },
  {
    rule: 'limit decision without a limit target',
    base: 'pfs',
    form: { targetKind: 'margin' },
    flags: { target: 'margin:0.05' },
    setup: { target: { kind: 'margin', value: 0.05 } },
    refused: {
      path: 'rule',
      message: 'the limit decision (sprt) needs a limit target',
      flag: 'rule',
      field: 'rule',
    },
  },
  {
    rule: 'limit decision without its risks and zone',
    base: 'pfs',
    form: 'the form always carries the SPRT fields with the rule (an empty one is "required")',
    flags: { 'sprt-alpha': null, 'sprt-beta': null, 'sprt-lower': null, 'sprt-upper': null },
    setup: { sprt: undefined },
    refused: {
      path: 'sprt',
      message: 'missing: the limit decision (sprt) needs the two risks and the indifference zone',
      flag: 'sprt-lower',
      field: null,
    },
  },
  // pass/fail targets are proportions (Wilson 1927: p in [0, 1])
  {
    rule: 'pass/fail limit of 100 %',
    base: 'pfs',
    form: { targetValue: '100' },
    flags: { target: 'limit:1' },
    setup: { target: { ...LIMIT, value: 1 } },
    refused: {
      path: 'target.value',
      message: 'must be strictly between 0 and 1 for pass/fail (a proportion: 0 % and 100 %)',
      flag: 'target',
      field: 'targetValue',
    },
  },
  {
    rule: 'pass/fail margin of 100 percentage points',
    base: 'pf',
    form: { targetValue: '100' },
    flags: { target: 'margin:1' },
    setup: { target: { kind: 'margin', value: 1 } },
    refused: {
      path: 'target.value',
      message: 'must be below 1 for pass/fail (a proportion: 100 percentage points)',
      flag: 'target',
      field: 'targetValue',
    },
  },
  {
    rule: 'margin of 0',
    base: 'm',
    form: { targetValue: '0' },
    flags: { target: 'margin:0' },
    setup: { target: { kind: 'margin', value: 0 } },
    refused: { path: 'target.value', message: ABOVE_0, flag: 'target', field: 'targetValue' },
  },
  // a confidence level is a probability (Neyman 1937)
  {
    rule: 'level 100 %',
    base: 'm',
    form: { level: 'custom', customLevel: '100' },
    flags: { level: '1' },
    setup: { level: 1 },
    refused: { path: 'level', message: BETWEEN_0_1, flag: 'level', field: 'customLevel' },
  },
  {
    rule: 'level 30 %',
    base: 'm',
    form: { level: 'custom', customLevel: '30' },
    flags: { level: '0.3' },
    setup: { level: 0.3 },
  },
  // counts of observations are whole numbers
  {
    rule: 'minimum 0',
    base: 'm',
    form: { min: '0' },
    flags: { min: '0' },
    setup: { min: 0 },
    refused: { path: 'min', message: WHOLE, flag: 'min', field: 'min' },
  },
  {
    rule: 'minimum 2.5',
    base: 'm',
    form: { min: '2.5' },
    flags: { min: '2.5' },
    setup: { min: 2.5 },
    refused: { path: 'min', message: WHOLE, flag: 'min', field: 'min' },
  },
  { rule: 'minimum 1', base: 'm', form: { min: '1' }, flags: { min: '1' }, setup: { min: 1 } },
  // a share of the site: strictly between nothing and all of it; the form asks in percent, the command line
  // takes a fraction or a percentage
  {
    rule: 'hot-spot share 0',
    base: 'm',
    form: { hotSpot: '0' },
    flags: { 'hot-spot-share': '0' },
    setup: { hotSpotShare: 0 },
    refused: { path: 'hotSpotShare', message: BETWEEN_0_1, flag: 'hot-spot-share', field: 'hotSpot' },
  },
  {
    rule: 'hot-spot share 100 %',
    base: 'pf',
    form: { hotSpot: '100' },
    flags: { 'hot-spot-share': '100%' },
    setup: { hotSpotShare: 1 },
    refused: { path: 'hotSpotShare', message: BETWEEN_0_1, flag: 'hot-spot-share', field: 'hotSpot' },
  },
  {
    rule: 'hot-spot share 20 %',
    base: 'c',
    form: { hotSpot: '20' },
    flags: { 'hot-spot-share': '20%' },
    setup: { hotSpotShare: 0.2 },
  },
  {
    rule: 'planned maximum below the minimum',
    base: 'm',
    form: { max: '5' },
    flags: { max: '5' },
    setup: { max: 5 },
    refused: {
      path: 'max',
      message: 'must not be below the minimum number of observations before a verdict',
      flag: 'max',
      field: 'max',
    },
  },
  {
    rule: 'population 0',
    base: 'm',
    form: { population: '0' },
    flags: { population: '0' },
    setup: { population: 0 },
    refused: { path: 'population', message: WHOLE, flag: 'population', field: 'population' },
  },
  // densities are per plot area > 0, for counts only
  {
    rule: 'plot area 0',
    base: 'c',
    form: { plotArea: '0' },
    flags: { 'plot-area': '0' },
    setup: { plotArea: 0 },
    refused: { path: 'plotArea', message: ABOVE_0, flag: 'plot-area', field: 'plotArea' },
  },
  {
    rule: 'plot area on measurements',
    base: 'm',
    form: 'the form asks for a plot area with counts only',
    flags: { 'plot-area': '1' },
    setup: { plotArea: 1 },
    refused: { path: 'plotArea', message: 'applies to counts only', flag: 'plot-area', field: null },
  },
  // Taylor 1961 (Nature 189:732): s² = a·m^b, a > 0, both coefficients
  {
    rule: 'Taylor a without b',
    base: 'c',
    form: { taylorA: '1.5' },
    flags: { 'taylor-a': '1.5' },
    setup: { planning: { taylorA: 1.5 } },
    refused: {
      path: 'planning.taylorB',
      message: 'missing (Taylor’s power law needs both a and b)',
      flag: 'taylor-b',
      field: 'taylorB',
    },
  },
  {
    rule: 'Taylor b of 0',
    base: 'c',
    form: { taylorA: '1.5', taylorB: '0' },
    flags: { 'taylor-a': '1.5', 'taylor-b': '0' },
    setup: { planning: { taylorA: 1.5, taylorB: 0 } },
    refused: {
      path: 'planning.taylorB',
      message: 'must be greater than 0 and at most 5',
      flag: 'taylor-b',
      field: 'taylorB',
    },
  },
  {
    rule: 'Taylor a 1.5, b 1.3',
    base: 'c',
    form: { taylorA: '1.5', taylorB: '1.3' },
    flags: { 'taylor-a': '1.5', 'taylor-b': '1.3' },
    setup: { planning: { taylorA: 1.5, taylorB: 1.3 } },
  },
  // negative binomial: Var = m + m²/k with k > 0 (Anscombe 1949)
  {
    rule: 'negative binomial k 0',
    base: 'c',
    form: { nbK: '0' },
    flags: { 'nb-k': '0' },
    setup: { planning: { negBinomialK: 0 } },
    refused: { path: 'planning.negBinomialK', message: ABOVE_0, flag: 'nb-k', field: 'nbK' },
  },
  {
    rule: 'planning coefficients on measurements',
    base: 'm',
    form: 'the form asks for planning coefficients with counts only',
    flags: { 'nb-k': '2' },
    setup: { planning: { negBinomialK: 2 } },
    refused: { path: 'planning', message: 'applies to counts only', flag: 'nb-k', field: null },
  },
  // Kuno 1969 stop line: Iwao's α > −1 (a value after a space that starts with a dash)
  {
    rule: 'Iwao α −1',
    base: 'c',
    form: NO_FORM_DESIGN,
    flags: { 'iwao-alpha': '-1', 'iwao-beta': '1' },
    setup: { planning: { iwaoAlpha: -1, iwaoBeta: 1 } },
    refused: {
      path: 'planning.iwaoAlpha',
      message: 'must be greater than −1',
      flag: 'iwao-alpha',
      field: null,
    },
  },
  {
    rule: 'Iwao α −0.5, β 1.2',
    base: 'c',
    form: NO_FORM_DESIGN,
    flags: { 'iwao-alpha': '-0.5', 'iwao-beta': '1.2' },
    setup: { planning: { iwaoAlpha: -0.5, iwaoBeta: 1.2 } },
  },
  // Helsel 2012: non-detects are results of measurements
  {
    rule: 'non-detects on counts',
    base: 'c',
    form: NO_FORM_DESIGN,
    flags: { 'non-detects': 'half-limit' },
    setup: { nonDetects: 'half-limit' },
    refused: {
      path: 'nonDetects',
      message: 'applies to measurements only',
      flag: 'non-detects',
      field: null,
    },
  },
  // Cochran 1977 ch. 5: stratum weights > 0, one name each (one stratum gives the unstratified mean)
  {
    rule: 'composite design with strata',
    base: 'm',
    form: NO_FORM_DESIGN,
    flags: { design: 'composite', strata: 'a:1,b:1' },
    setup: {
      design: 'composite',
      strata: [
        { name: 'a', weight: 1 },
        { name: 'b', weight: 1 },
      ],
    },
    refused: {
      path: 'design',
      message: 'a composite design cannot be combined with strata',
      flag: 'design',
      field: null,
    },
  },
  {
    rule: 'one stratum (the unstratified mean)',
    base: 'm',
    form: { strata: 'woodland:1' },
    flags: { strata: 'woodland:1' },
    setup: { strata: [{ name: 'woodland', weight: 1 }] },
    input: '1,woodland\n2,woodland\n',
  },
  {
    rule: 'stratum weight 0',
    base: 'm',
    form: { strata: 'a:0,b:1' },
    flags: { strata: 'a:0,b:1' },
    setup: {
      strata: [
        { name: 'a', weight: 0 },
        { name: 'b', weight: 1 },
      ],
    },
    refused: {
      path: 'strata[0].weight',
      message: 'must be greater than 0 (stratum "a")',
      flag: 'strata',
      field: 'strata',
    },
  },
  {
    rule: 'stratum named twice',
    base: 'm',
    form: { strata: 'a:1,a:2' },
    flags: { strata: 'a:1,a:2' },
    setup: {
      strata: [
        { name: 'a', weight: 1 },
        { name: 'a', weight: 2 },
      ],
    },
    refused: { path: 'strata[1].name', message: '"a" is listed twice', flag: 'strata', field: 'strata' },
  },
  {
    rule: 'stratum effort 0',
    base: 'm',
    form: { strata: 'a:1,b:1', strataCosts: 'b:0' },
    flags: { strata: 'a:1,b:1', cost: 'b:0' },
    setup: {
      strata: [
        { name: 'a', weight: 1 },
        { name: 'b', weight: 1, cost: 0 },
      ],
    },
    refused: {
      path: 'strata[1].cost',
      message: 'must be greater than 0 (stratum "b")',
      flag: 'cost',
      field: 'strataCosts',
    },
  },
  {
    rule: 'two strata',
    base: 'm',
    form: { strata: 'a:1,b:1' },
    flags: { strata: 'a:1,b:1' },
    setup: {
      strata: [
        { name: 'a', weight: 1 },
        { name: 'b', weight: 1 },
      ],
    },
    input: '1,a\n2,a\n3,b\n4,b\n',
  },
];

function withOverrides<T extends object>(base: T, over: object): T {
  const out = { ...base, ...over } as Record<string, unknown>;
  for (const [k, v] of Object.entries(out)) if (v === undefined) delete out[k];
  return out as unknown as T;
}

function argv(base: Record<string, string>, over: Record<string, string | null>): string[] {
  const flags: Record<string, string | null> = { ...base, ...over };
  // `--name value` with a space, as typed (a value such as -1 must still be read as the value)
  return Object.entries(flags).flatMap(([k, v]) => (v === null ? [] : [`--${k}`, v]));
}

describe.each(CASES)('$rule', (c) => {
  const base = BASES[c.base];
  const setup = withOverrides(base.setup, c.setup);
  const r = c.refused;

  it('the form', () => {
    if (typeof c.form === 'string') {
      expect(r?.field ?? null, c.form).toBeNull();
      return;
    }
    const out = buildSetup({ ...base.form, ...c.form });
    if (r === undefined) {
      expect(out).toEqual({ setup, name: 'Rules' });
      return;
    }
    expect('errors' in out && out.errors).toEqual({ [r.field!]: expect.stringMatching(/^[^:]+: /) });
    const shown = 'errors' in out ? out.errors[r.field!]! : '';
    expect(shown.slice(shown.indexOf(': ') + 2)).toBe(r.message);
  });

  it('the command line', () => {
    const p = spawnSync(process.execPath, [bin, 'assess', ...argv(base.flags, c.flags)], {
      input: c.input ?? '1\n',
      encoding: 'utf8',
      cwd: root,
    });
    if (r === undefined) {
      expect(p.stderr).toBe('');
      expect(p.status).toBe(0);
      return;
    }
    expect(p.status).toBe(2);
    expect(p.stdout).toBe('');
    expect(p.stderr).toBe(`sure-enough: flag --${r.flag}: ${r.message}\n`);
  });

  it('the bundle importer', async () => {
    const st = study({}, { setup });
    const b = await makeBundle(st, entries(st, [1], 'phone-A', 2));
    const out = await parseBundle(serializeBundle(b));
    if (r === undefined) expect(out.ok).toBe(true);
    else expect(out).toEqual({ ok: false, problems: [`study.setup.${r.path}: ${r.message}`] });
  });

  it('the core', () => {
    if (r === undefined) expect(() => assertSetup(setup)).not.toThrow();
    else expect(() => assertSetup(setup)).toThrow(new RangeError(`${r.path}: ${r.message}`));
  });
});
