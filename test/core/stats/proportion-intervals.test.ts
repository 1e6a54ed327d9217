// Pass/fail intervals against Newcombe's (1998) illustrative table (shared check values, evidence beside
// each), the closed-form zero bound, hypergeometric bounds (scipy brute force), and scipy grids
// (stats-binomial.json, stats-hypergeometric.json, `python3 test/fixtures/stats-fixtures.py`).
import { describe, expect, it } from 'vitest';
import type { Sided } from '../../../src/model/types.ts';
import { agrestiCoullInterval } from '../../../src/stats/agresti-coull-interval.ts';
import { clopperPearsonInterval } from '../../../src/stats/clopper-pearson-interval.ts';
import { hypergeometricBounds, hypergeometricCdf } from '../../../src/stats/hypergeometric-bounds.ts';
import { jeffreysInterval } from '../../../src/stats/jeffreys-interval.ts';
import { wilsonCcInterval } from '../../../src/stats/wilson-cc-interval.ts';
import { wilsonInterval } from '../../../src/stats/wilson-interval.ts';
import bin from '../../fixtures/stats-binomial.json';
import hyp from '../../fixtures/stats-hypergeometric.json';

const FNS = {
  wilson: wilsonInterval,
  'wilson-cc': wilsonCcInterval,
  jeffreys: jeffreysInterval,
  'clopper-pearson': clopperPearsonInterval,
  'agresti-coull': agrestiCoullInterval,
} as const;
type Name = keyof typeof FNS;

describe('Newcombe (1998) Stat Med 17:857–872 illustrative table, 95 %', () => {
  it.each([
    ['wilson', 81, 263, 0.2553, 0.3662, 'secondary'],
    ['wilson', 15, 148, 0.0624, 0.1605, 'secondary'],
    ['clopper-pearson', 81, 263, 0.2527, 0.3676, 'secondary'],
    ['clopper-pearson', 15, 148, 0.0578, 0.1617, 'secondary'],
    ['wilson-cc', 81, 263, 0.2535, 0.3682, 'memory'],
    ['wilson', 0, 20, 0, 0.1611, 'memory'],
    ['clopper-pearson', 0, 20, 0, 0.1684, 'memory'],
    ['wilson', 1, 29, 0.0061, 0.1718, 'memory'],
    ['clopper-pearson', 1, 29, 0.0009, 0.1776, 'memory'],
  ] as const)('%s x=%i n=%i → (%f, %f) [%s]', (name, x, n, lo, up, _evidence) => {
    const r = FNS[name as Name](x, n, 0.95, 'two');
    expect(Math.abs(r.lower - lo)).toBeLessThan(5e-5 + 1e-12);
    expect(Math.abs(r.upper - up)).toBeLessThan(5e-5 + 1e-12);
  });
  it('Jeffreys 81/263 (0.254522, 0.365647) and Agresti–Coull (0.255221, 0.366277) [derived, scipy]', () => {
    const j = jeffreysInterval(81, 263, 0.95, 'two');
    expect(Math.abs(j.lower - 0.254522)).toBeLessThan(1e-6);
    expect(Math.abs(j.upper - 0.365647)).toBeLessThan(1e-6);
    const a = agrestiCoullInterval(81, 263, 0.95, 'two');
    expect(Math.abs(a.lower - 0.255221)).toBeLessThan(1e-6);
    expect(Math.abs(a.upper - 0.366277)).toBeLessThan(1e-6);
  });
});

describe('zero counted: exact one-sided bound 1 − α^{1/n}', () => {
  it('n = 20 → 0.1391 (vs rule of three 0.15); n = 100 → 0.0295 (Hanley & Lippman-Hand 1983) [derived]', () => {
    expect(Math.abs(clopperPearsonInterval(0, 20, 0.95, 'upper').upper - 0.1391)).toBeLessThan(5e-5);
    expect(Math.abs(clopperPearsonInterval(0, 100, 0.95, 'upper').upper - 0.0295)).toBeLessThan(5e-5);
  });
  it('differs from the two-sided 95 % Clopper–Pearson upper limit 0.1684, the one-sided 97.5 % bound (Clopper & Pearson 1934) [derived]', () => {
    expect(Math.abs(clopperPearsonInterval(0, 20, 0.95, 'two').upper - 0.1684)).toBeLessThan(5e-5);
  });
});

type BinCase = { x: number; n: number; level: number } & Record<Name, [number, number]>;
describe('all five methods vs scipy on a grid [derived]', () => {
  it.each(bin.cases as BinCase[])('x=$x n=$n level=$level', (c) => {
    for (const name of Object.keys(FNS) as Name[]) {
      const r = FNS[name](c.x, c.n, c.level, 'two');
      // beta.inv ≤ 7.6e-8 relative (src/stats/README.md, "jstat's accuracy")
      expect(Math.abs(r.lower - c[name][0])).toBeLessThan(2e-7);
      expect(Math.abs(r.upper - c[name][1])).toBeLessThan(2e-7);
    }
  });
});

describe('hypergeometric bounds for a finite lot', () => {
  it('N = 500, n = 50, x = 0 → D_U = 27 (largest D with P(X ≤ 0 | N, D, n) ≥ α) [derived]', () => {
    expect(hypergeometricBounds(0, 50, 500, 0.95, 'upper').upperCount).toBe(27);
  });
  it.each(hyp.cases)('N=$lot n=$n x=$x $sided vs scipy hypergeom exhaustive search [derived]', (c) => {
    const r = hypergeometricBounds(c.x, c.n, c.lot, c.level, c.sided as Sided);
    expect(r.upperCount).toBe(c.upperCount);
    expect(r.lowerCount).toBe(c.lowerCount);
  });
  it('cdf sums to 1 and matches a direct sum', () => {
    expect(hypergeometricCdf(50, 500, 30, 50)).toBe(1);
    const direct = [0, 1, 2].reduce((a, k) => a + comb(30, k) * comb(470, 50 - k), 0) / comb(500, 50);
    expect(hypergeometricCdf(2, 500, 30, 50)).toBeCloseTo(direct, 12);
  });
});

function comb(n: number, k: number): number {
  let r = 1;
  for (let i = 1; i <= k; i++) r = (r * (n - k + i)) / i;
  return r;
}

describe('invariants over a grid', () => {
  it('bounds in [0, 1], contain the estimate, wider at higher confidence, one-sided inside two-sided', () => {
    for (const n of [1, 7, 30, 400]) {
      for (const x of [0, 1, Math.floor(n / 3), n]) {
        if (x > n) continue;
        for (const name of Object.keys(FNS) as Name[]) {
          let prev = -1;
          for (const level of [0.6, 0.8, 0.9, 0.95, 0.99, 0.999]) {
            const r = FNS[name](x, n, level, 'two');
            expect(r.lower).toBeGreaterThanOrEqual(0);
            expect(r.upper).toBeLessThanOrEqual(1);
            if (name !== 'agresti-coull') {
              expect(r.lower).toBeLessThanOrEqual(r.estimate + 1e-12);
              expect(r.upper).toBeGreaterThanOrEqual(r.estimate - 1e-12);
            }
            const w = r.upper - r.lower;
            expect(w).toBeGreaterThanOrEqual(prev - 1e-12);
            prev = w;
            const up = FNS[name](x, n, level, 'upper');
            expect(up.upper).toBeLessThanOrEqual(r.upper + 1e-12);
            expect(up.lower).toBe(0);
          }
        }
      }
    }
  });
  it('Clopper–Pearson contains Wilson (it is the conservative one)', () => {
    for (const [x, n] of [
      [3, 40],
      [20, 50],
      [81, 263],
    ]) {
      const cp = clopperPearsonInterval(x!, n!, 0.95, 'two');
      const w = wilsonInterval(x!, n!, 0.95, 'two');
      expect(cp.upper - cp.lower).toBeGreaterThan(w.upper - w.lower);
    }
  });
});
