/**
 * Small deterministic simulations (fixed seeds, a few hundred runs) of every stopping rule through the
 * app's per-entry path: a rule must never stop before the minimum, never on zero spread, all-zero counts
 * or one distinct value (measurements and counts), and the fast replay path must stop exactly where
 * assessSummary first gives a verdict other than `keep going`. Evidence: the guards written in
 * src/stop/README.md (an early zero spread would otherwise stop at once); no external numbers needed — these are invariants.
 * Also the Green and Kuno stop-line values of the shared check values (seq-green-…, seq-kuno) [derived].
 */
import { describe, expect, it } from 'vitest';
import { assess, RunningAssessment, replaySequence } from '../../../src/assess/index.ts';
import type { AnalysisSetup, RuleName } from '../../../src/model/types.ts';
import { greenStopLine } from '../../../src/stop/green-stop-line.ts';
import { kunoStopLine } from '../../../src/stop/kuno-stop-line.ts';
import { ruleWarnings } from '../../../src/stop/rule-warnings.ts';
import { standardLevel } from '../../../src/stop/standard-level.ts';
import { bernoulliVariate } from '../../sim/bernoulli-variate.ts';
import { lognormalVariate } from '../../sim/lognormal-variate.ts';
import { negativeBinomialVariate } from '../../sim/negative-binomial-variate.ts';
import { normalVariate } from '../../sim/normal-variate.ts';
import { poissonVariate } from '../../sim/poisson-variate.ts';
import { createRng, type Rng } from '../../sim/xoshiro128.ts';

const RULES: RuleName[] = ['naive', 'standard', 'strict', 'sprt'];

interface Case {
  setup: AnalysisSetup;
  draw: (g: Rng) => number;
}
const sprt = { alpha: 0.05, beta: 0.1 };
const cases: Case[] = [
  {
    setup: {
      kind: 'measurement',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      min: 10,
      target: { kind: 'margin', value: 0.5 },
      sprt: { ...sprt, lowerBound: 9.5, upperBound: 10.5 },
    },
    draw: (g) => normalVariate(g, 10, 1),
  },
  {
    setup: {
      kind: 'measurement',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      method: 'cox',
      min: 12,
      target: { kind: 'relative', value: 0.3 },
      sprt: { ...sprt, lowerBound: 0.8, upperBound: 1.25 },
    },
    draw: (g) => lognormalVariate(g, 1, 1),
  },
  {
    setup: {
      kind: 'count',
      level: 0.9,
      sided: 'two',
      rule: 'standard',
      min: 10,
      target: { kind: 'relative', value: 0.3 },
      sprt: { ...sprt, lowerBound: 1.5, upperBound: 2.5 },
    },
    draw: (g) => negativeBinomialVariate(g, 2, 2),
  },
  {
    // near-Poisson counts: the default method switches between exact Poisson and t with the dispersion test,
    // and the exact Poisson interval is bounded without inversions in replay (garwood-poisson-bracket.ts)
    setup: {
      kind: 'count',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      min: 10,
      target: { kind: 'relative', value: 0.2 },
      sprt: { ...sprt, lowerBound: 1.6, upperBound: 2.5 },
    },
    draw: (g) => poissonVariate(g, 2),
  },
  {
    setup: {
      kind: 'count',
      level: 0.9,
      sided: 'upper',
      rule: 'standard',
      method: 'poisson-exact',
      min: 10,
      target: { kind: 'margin', value: 0.35 },
      sprt: { ...sprt, lowerBound: 1.6, upperBound: 2.5 },
    },
    draw: (g) => poissonVariate(g, 2),
  },
  {
    // Land's method: replay bounds it from inside with a table of nodes (land-inner-bounds.ts)
    setup: {
      kind: 'measurement',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      method: 'land',
      min: 12,
      target: { kind: 'relative', value: 0.3 },
      sprt: { ...sprt, lowerBound: 0.8, upperBound: 1.25 },
    },
    draw: (g) => lognormalVariate(g, 1, 1),
  },
  {
    setup: {
      kind: 'pass-fail',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      min: 20,
      target: { kind: 'margin', value: 0.08 },
      sprt: { ...sprt, lowerBound: 0.1, upperBound: 0.25 },
    },
    draw: (g) => bernoulliVariate(g, 0.15),
  },
];

function withRule(setup: AnalysisSetup, rule: RuleName): AnalysisSetup {
  if (rule !== 'sprt') return { ...setup, rule };
  const zone = setup.sprt as NonNullable<AnalysisSetup['sprt']>;
  return { ...setup, rule, target: { kind: 'limit', value: (zone.lowerBound + zone.upperBound) / 2 } };
}

/** First n at which the app's full running assessment gives a verdict other than keep going. */
function firstStopByAssess(values: number[], setup: AnalysisSetup): number | null {
  const running = new RunningAssessment(setup);
  for (const v of values) {
    running.addValue(v);
    if (running.assessWith({ projection: false }).verdict.status !== 'keep going') return running.n;
  }
  return null;
}

describe('every rule, simulated (fixed seeds)', () => {
  for (const c of cases)
    for (const rule of RULES) {
      const setup = withRule(c.setup, rule);
      it(`${c.setup.kind}${c.setup.method ? `/${c.setup.method}` : ''} ${rule}: never before the minimum; replay = app path`, () => {
        const rng = createRng(777);
        let stopped = 0;
        for (let r = 0; r < 150; r++) {
          const values = Array.from({ length: 400 }, () => c.draw(rng));
          const fast = replaySequence(values, setup);
          if (fast.stoppedAt !== null) {
            stopped++;
            expect(fast.stoppedAt).toBeGreaterThanOrEqual(setup.min);
          }
          if (r < 40) expect(fast.stoppedAt).toBe(firstStopByAssess(values, setup));
        }
        // the rule does stop on ordinary data (a test that cannot pass vacuously)
        expect(stopped).toBeGreaterThan(100);
      });
    }
});

describe('no stop on zero spread, all-zero counts or one distinct value', () => {
  for (const rule of RULES) {
    it(`${rule}: constant measurements, all-zero counts, constant counts never stop`, () => {
      const m = withRule(cases[0]!.setup, rule);
      expect(replaySequence(new Array(300).fill(10), m).stoppedAt).toBeNull();
      const c = withRule(cases[2]!.setup, rule);
      expect(replaySequence(new Array(300).fill(0), c).stoppedAt).toBeNull();
      expect(replaySequence(new Array(300).fill(3), c).stoppedAt).toBeNull();
    });
  }
  it('a run of equal values followed by spread: no stop while the values are all equal', () => {
    const rng = createRng(5);
    for (const rule of RULES) {
      const setup = withRule(cases[0]!.setup, rule);
      for (let r = 0; r < 50; r++) {
        const values = [
          ...new Array(30).fill(10),
          ...Array.from({ length: 200 }, () => normalVariate(rng, 10, 1)),
        ];
        const res = replaySequence(values, setup);
        if (res.stoppedAt !== null) expect(res.stoppedAt).toBeGreaterThan(30);
      }
    }
  });
});

describe('pass/fail with one outcome only: never `enough`, but a limit may be decided (zero acceptance)', () => {
  const pf = cases.find((c) => c.setup.kind === 'pass-fail')!.setup;
  for (const rule of ['naive', 'standard', 'strict'] as const) {
    it(`${rule}: all-pass or all-fail items never meet a margin target; the first stop comes after the first other outcome`, () => {
      const setup = { ...pf, rule };
      for (const v of [0, 1]) {
        // Without the guard, Wilson's 95 % half-width with none counted is below 0.08 from n ≈ 21 on.
        const same = new Array(300).fill(v);
        expect(replaySequence(same, setup).stoppedAt).toBeNull();
        const a = assess(
          same.map((value) => ({ value })),
          setup,
        );
        expect(a.verdict.status).toBe('keep going');
        if (a.verdict.status === 'keep going') {
          expect(a.verdict.reason).toBe('one-distinct-value');
          expect(a.verdict.message).toMatch(/limit target/);
        }
      }
      for (const relOrPrec of [
        { kind: 'relative', value: 0.5 },
        { kind: 'precision', value: 0.2 },
      ] as const) {
        const ones = new Array(300).fill(1);
        expect(replaySequence(ones, { ...setup, target: relOrPrec }).stoppedAt).toBeNull();
      }
      const rng = createRng(11);
      for (let r = 0; r < 30; r++) {
        const values = [
          ...new Array(60).fill(0),
          ...Array.from({ length: 600 }, () => bernoulliVariate(rng, 0.2)),
        ];
        const fast = replaySequence(values, setup);
        expect(fast.stoppedAt).toBe(firstStopByAssess(values, setup));
        if (fast.stoppedAt !== null) expect(fast.stoppedAt).toBeGreaterThan(values.indexOf(1));
      }
    });
  }
  it('zero-acceptance: no defect in n items is `below limit` 2 % once 1 − α^(1/n) < 0.02 — 149 items at 95 % (Hanley & Lippman-Hand 1983, ⌈ln 0.05 / ln 0.98⌉ = 149) [memory; derived]', () => {
    // the SPRT zone of the shared pass/fail case belongs to another limit; these rules do not read it
    const { sprt: _zone, ...withoutZone } = pf;
    const setup: AnalysisSetup = { ...withoutZone, rule: 'naive', target: { kind: 'limit', value: 0.02 } };
    const status = (n: number) =>
      assess(
        new Array(n).fill(0).map((value) => ({ value })),
        setup,
      ).verdict.status;
    expect(status(148)).toBe('keep going');
    expect(status(149)).toBe('below limit');
    expect(replaySequence(new Array(300).fill(0), setup).stoppedAt).toBe(149);
    // standard: checked at 1 − 0.9·0.7·0.05 = 96.85 % (ρ 0.9 for pass/fail times 0.7 for a limit,
    // src/stop/standard-level.ts), ⌈ln 0.0315 / ln 0.98⌉ = ⌈171.15⌉ = 172 [derived]
    const std = { ...setup, rule: 'standard' as const };
    expect(replaySequence(new Array(300).fill(0), std).stoppedAt).toBe(172);
    expect(firstStopByAssess(new Array(300).fill(0), std)).toBe(172);
  });
});

describe('standard rule level', () => {
  it('is above the nominal level and grows with the log spread and the dispersion', () => {
    for (const level of [0.8, 0.9, 0.95, 0.99]) {
      for (const kind of ['measurement', 'count', 'pass-fail'] as const)
        expect(standardLevel({ kind, level })).toBeGreaterThan(level);
      const cox = { kind: 'measurement' as const, method: 'cox' as const, level };
      expect(standardLevel(cox, 1.2)).toBeGreaterThan(standardLevel(cox, 0.5));
      expect(standardLevel({ kind: 'count', level }, null, 5)).toBeGreaterThan(
        standardLevel({ kind: 'count', level }, null, 1),
      );
    }
  });
  it('warns for the regimes the benchmark found short', () => {
    expect(
      ruleWarnings({
        kind: 'measurement',
        level: 0.95,
        sided: 'two',
        rule: 'standard',
        min: 10,
        method: 't',
      }).join(' '),
    ).toMatch(/skewed.*let the data choose/);
    expect(
      ruleWarnings({ kind: 'count', level: 0.95, sided: 'two', rule: 'standard', min: 10 }).join(' '),
    ).toMatch(/clumped/i);
    expect(
      ruleWarnings({ kind: 'measurement', level: 0.95, sided: 'two', rule: 'naive', min: 10 }).join(' '),
    ).toMatch(/naive/);
    // pass/fail with a margin target: the one-outcome guard's cost at a rare outcome (coverage.md,
    // Bernoulli p = 0.02, n* = 100: mean n 1.40·n*); a limit target is not affected
    const pf = { kind: 'pass-fail', level: 0.95, sided: 'two', rule: 'standard', min: 30 } as const;
    expect(ruleWarnings({ ...pf, target: { kind: 'margin', value: 0.03 } }).join(' ')).toMatch(/1\.4 times/);
    expect(ruleWarnings({ ...pf, target: { kind: 'limit', value: 0.03 } }).join(' ')).not.toMatch(
      /1\.4 times/,
    );
  });
});

describe('Green and Kuno stop lines (Green 1970; Kuno 1969; check values seq-green-a2.0-b1.5-D0.25, seq-kuno) [derived]', () => {
  it('Green a = 2, b = 1.5, D = 0.25 → 1024/n: 204.8, 102.4, 51.2, 20.48', () => {
    const expected = [204.8, 102.4, 51.2, 20.48];
    [5, 10, 20, 50].forEach((n, i) => {
      const line = greenStopLine({ a: 2, b: 1.5, D: 0.25 }, n);
      expect(Math.abs(line.total - expected[i]!)).toBeLessThan(1e-4);
      expect(line.stopWhen).toBe('at-least');
    });
  });
  it('Green with b > 2 reverses the inequality; b = 2 is the fixed size a/D²', () => {
    // b = 2.5, a = 1, D = 0.2: T = (0.04)^{2} · n^{3} = 0.0016 n³ (derived from the formula)
    const l = greenStopLine({ a: 1, b: 2.5, D: 0.2 }, 10);
    expect(l.stopWhen).toBe('at-most');
    expect(l.total).toBeCloseTo(1.6, 10);
    expect(greenStopLine({ a: 2, b: 2, D: 0.25 }, 31).total).toBe(Number.POSITIVE_INFINITY);
    expect(greenStopLine({ a: 2, b: 2, D: 0.25 }, 32).total).toBe(0);
  });
  it('Kuno α = 0.5, β = 1.3, D = 0.2 → 150, 60, 44.118; undefined for n ≤ (β−1)/D² = 7.5', () => {
    const expected = [150, 60, 44.118];
    [10, 20, 50].forEach((n, i) => {
      expect(
        Math.abs((kunoStopLine({ alpha: 0.5, beta: 1.3, D: 0.2 }, n) as number) - expected[i]!),
      ).toBeLessThan(1e-3);
    });
    expect(kunoStopLine({ alpha: 0.5, beta: 1.3, D: 0.2 }, 7)).toBeNull();
    expect(kunoStopLine({ alpha: 0.5, beta: 1.3, D: 0.2 }, 8)).not.toBeNull();
  });
});
