// The one setup validator (src/model/setup.ts): what it accepts, what it refuses and where it says the
// problem is. Ranges come from the published methods the setup feeds; each check names its source and
// evidence level. The same rules through every surface (form, command line, bundle, core):
// setup-rules.test.ts.
import { describe, expect, it } from 'vitest';
import type { StudySetup } from '../../../src/model/records.ts';
import {
  assertSetup,
  METHODS_BY_KIND,
  SETUP_KEYS,
  setupPath,
  setupProblems,
  validSetup,
} from '../../../src/model/setup.ts';

const base: StudySetup = {
  kind: 'count',
  level: 0.95,
  sided: 'two',
  rule: 'standard',
  min: 10,
  target: { kind: 'precision', value: 0.2 },
  plotArea: 0.25,
  plotAreaUnit: 'm2',
};
const paths = (v: unknown) => setupProblems(v).map((p) => p.path);

describe('a valid setup', () => {
  it('every member of a stored setup at once is accepted', () => {
    const full: Required<StudySetup> = {
      kind: 'count',
      level: 0.9,
      sided: 'upper',
      method: 'quasi-poisson',
      target: { kind: 'limit', value: 2, source: 'Pest threshold 2026', date: '2026-03-01' },
      rule: 'sprt',
      min: 12,
      hotSpotShare: 0.05,
      population: 400,
      plotArea: 0.25,
      max: 200,
      planning: { negBinomialK: 1.2, taylorA: 1.8, taylorB: 1.3, iwaoAlpha: -0.4, iwaoBeta: 1.2 },
      sprt: { alpha: 0.05, beta: 0.1, lowerBound: 1.5, upperBound: 2.5, maxN: 200 },
      strata: [
        { name: 'wet', weight: 2, cost: 3, population: 40 },
        { name: 'dry', weight: 1 },
      ],
      design: 'composite',
      nonDetects: 'kaplan-meier',
      unit: '1',
      plotAreaUnit: 'm2',
      outcomeName: 'aphids',
      taxon: 'Aphis fabae',
      samplingProtocol: '0.25 m2 quadrats',
      reportingLimit: 1,
      decimalSeparator: ',',
      expectedRange: { low: 0, high: 10_000 },
      positionWarnM: 30,
      otherOutcomeName: 'no aphids',
    };
    // the full set of members is what the type declares (a member the validator does not know would be refused)
    expect([...SETUP_KEYS].sort()).toEqual(Object.keys(full).sort());
    // composite + strata, and non-detects / a reporting limit on counts, are refused; everything else passes
    expect(paths(full)).toEqual(['design', 'nonDetects', 'reportingLimit', 'otherOutcomeName']);
    const { design: _d, nonDetects: _n, reportingLimit: _r, otherOutcomeName: _o, ...rest } = full;
    expect(validSetup(rest)).toEqual({ ok: true, setup: rest });
    expect(() => assertSetup(rest)).not.toThrow();
  });
  it('the methods are the published interval names of each data kind', () => {
    // auto = chosen from the data (src/assess/method-choice.ts); Student t; Johnson's modified t (Johnson 1978,
    // JASA 73:536); gamma-based (Grice & Bain 1980, JASA 75:929); modified Cox (Olsson 2005); Land 1971;
    // Chebyshev; Poisson exact (Garwood 1936);
    // quasi-Poisson (McCullagh & Nelder 1989); Wilson 1927 with and without continuity correction
    // (Newcombe 1998); Jeffreys (Brown, Cai & DasGupta 2001); Clopper & Pearson 1934; Agresti & Coull 1998
    // [read]
    expect(METHODS_BY_KIND).toEqual({
      measurement: ['auto', 't', 'johnson-t', 'gamma', 'cox', 'land', 'chebyshev'],
      count: ['t', 'poisson-exact', 'quasi-poisson'],
      'pass-fail': ['wilson', 'wilson-cc', 'jeffreys', 'clopper-pearson', 'agresti-coull'],
    });
    expect(paths({ ...base, method: 'wilson' })).toEqual(['method']);
    expect(
      paths({ ...base, kind: 'pass-fail', plotArea: undefined, plotAreaUnit: undefined, method: 'wilson' }),
    ).toEqual([]);
  });
});

describe('the SPRT risks and zone', () => {
  const sprtSetup = (sprt: Record<string, unknown>): unknown => ({
    ...base,
    kind: 'pass-fail',
    plotArea: undefined,
    plotAreaUnit: undefined,
    rule: 'sprt',
    target: { kind: 'limit', value: 0.05 },
    sprt: { alpha: 0.05, beta: 0.1, lowerBound: 0.02, upperBound: 0.08, ...sprt },
  });
  it('every accepted (α, β) gives Wald boundaries with B < 1 < A; α or β of 0.5 is refused', () => {
    // Wald 1947, Sequential Analysis, §3.2: A = (1 − β)/α, B = β/(1 − α); the test decides only when
    // B < 1 < A, i.e. α + β < 1 [read/secondary]. The practitioner's rule here is α, β < 0.5.
    for (const alpha of [0.001, 0.05, 0.25, 0.4999, 0.5, 0.6])
      for (const beta of [0.001, 0.1, 0.4999, 0.5]) {
        const ok = setupProblems(sprtSetup({ alpha, beta })).length === 0;
        expect(ok).toBe(alpha < 0.5 && beta < 0.5);
        if (ok) expect(beta / (1 - alpha) < 1 && 1 < (1 - beta) / alpha).toBe(true);
      }
  });
  it('the zone is positive, below 1 for pass/fail and surrounds the limit', () => {
    // the Bernoulli log-likelihood ratio ln(θ₁/θ₀) + … needs 0 < θ₀ < θ₁ < 1 (Wald 1947, ch. 5) [read]
    expect(paths(sprtSetup({ lowerBound: 0 }))).toEqual(['sprt.lowerBound']);
    expect(paths(sprtSetup({ upperBound: 1 }))).toEqual(['sprt.upperBound']);
    expect(paths(sprtSetup({ lowerBound: 0.08, upperBound: 0.02 }))).toEqual(['sprt.upperBound']);
    expect(paths(sprtSetup({ lowerBound: 0.05 }))).toEqual(['sprt.lowerBound']);
    expect(paths(sprtSetup({ upperBound: 0.05 }))).toEqual(['sprt.upperBound']);
    expect(paths(sprtSetup({ lowerBound: undefined }))).toEqual(['sprt.lowerBound']);
  });
  it('the limit decision needs a limit target and its settings', () => {
    const s = sprtSetup({}) as StudySetup;
    expect(paths({ ...s, target: { kind: 'margin', value: 0.05 } })).toEqual(['rule']);
    expect(paths({ ...s, target: undefined })).toEqual(['rule']);
    expect(paths({ ...s, sprt: undefined })).toEqual(['sprt']);
  });
});

describe('refusals name the field path', () => {
  it.each<[string, Record<string, unknown>, string[]]>([
    ['not numbers', { level: '0.95', min: null }, ['level', 'min']],
    ['level outside (0, 1)', { level: 1 }, ['level']],
    ['min not whole', { min: 2.5 }, ['min']],
    ['max below min', { max: 5 }, ['max']],
    ['unknown member', { colour: 'red' }, ['colour']],
    [
      'unknown kind, rule and sidedness',
      { kind: 'weight', rule: 'fast', sided: 'both' },
      ['kind', 'sided', 'rule'],
    ],
    // Taylor 1961 (Nature 189:732): s² = a·m^b needs both coefficients, a > 0 [read]
    ['Taylor a without b', { planning: { taylorA: 1.8 } }, ['planning.taylorB']],
    ['Taylor b of 0', { planning: { taylorA: 1.8, taylorB: 0 } }, ['planning.taylorB']],
    // Kuno 1969 stop line: Iwao's α > −1 [secondary]
    ['Iwao α of −1', { planning: { iwaoAlpha: -1, iwaoBeta: 1 } }, ['planning.iwaoAlpha']],
    ['an empty list of strata', { strata: [] }, ['strata']],
    [
      'strata: empty name, zero weight, repeated name, unknown member',
      {
        strata: [
          { name: ' ', weight: 1 },
          { name: 'a', weight: 0 },
          { name: 'a', weight: 1, colour: 'red' },
        ],
      },
      ['strata[0].name', 'strata[1].weight', 'strata[2].colour', 'strata[2].name'],
    ],
    [
      'measurement settings on counts',
      { nonDetects: 'half-limit', reportingLimit: 0.5 },
      ['nonDetects', 'reportingLimit'],
    ],
    ['plot-area unit without a plot area', { plotArea: undefined }, ['plotAreaUnit']],
    [
      'expected range upside down, a third decimal separator, a position warning of 0 m',
      { expectedRange: { low: 5, high: 5 }, decimalSeparator: ';', positionWarnM: 0 },
      ['decimalSeparator', 'positionWarnM', 'expectedRange.high'],
    ],
    ['an open-ended expected range', { expectedRange: { high: 400 } }, []],
  ])('%s', (_label, over, expected) => {
    expect(paths({ ...base, ...over })).toEqual(expected);
  });
  it('a value that is not a setup at all', () => {
    expect(setupProblems(null)).toEqual([{ path: '', message: 'must be an object, got null' }]);
    expect(() => assertSetup([])).toThrow(new RangeError('setup: must be an object, got a list'));
  });
  it('assertSetup throws a RangeError with the first problem', () => {
    expect(() => assertSetup({ ...base, level: 1, min: 0 })).toThrow(
      new RangeError('level: must be strictly between 0 and 1 (0 % and 100 %)'),
    );
  });
  it('setupPath puts a surface prefix before a path', () => {
    expect(setupPath('study.setup', 'strata[1].name')).toBe('study.setup.strata[1].name');
    expect(setupPath('study.setup', '')).toBe('study.setup');
  });
});
