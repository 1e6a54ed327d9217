// assess / RunningAssessment: guards before any rule, verdicts through the rule seam, "how many more"
// (the worked example of src/plan/README.md, monotone in the target, population cap, smoothing), and
// equality of the per-entry and batch paths.
import { describe, expect, it } from 'vitest';
import { assess, checkTarget, RunningAssessment } from '../../src/assess/index.ts';
import type { AnalysisSetup, Point } from '../../src/model/types.ts';
import { RunningSummary } from '../../src/stats/running-summary.ts';

const pts = (xs: number[]): Point[] => xs.map((value) => ({ value }));
// a hot-spot share of 50 % needs only 5 entries (1 − 0.5⁵ ≥ 0.95), so `min` sets the minimum in these tests
const base: AnalysisSetup = {
  kind: 'measurement',
  level: 0.95,
  sided: 'two',
  rule: 'naive',
  min: 10,
  hotSpotShare: 0.5,
};
const normal12 = [49.2, 51.3, 47.9, 52.4, 50.1, 48.8, 53.0, 50.6, 49.5, 51.9, 47.4, 50.8];

describe('guards (never anything but keep going)', () => {
  it('before the minimum, with "at least M more"', () => {
    const a = assess(pts(normal12.slice(0, 6)), { ...base, target: { kind: 'margin', value: 100 } });
    expect(a.verdict).toMatchObject({ status: 'keep going', reason: 'below-minimum' });
    expect(a.more).toEqual({ likely: 4, low: 4, high: 4, atLeast: true });
    expect(a.lower).not.toBeNull(); // the interval is still shown
  });
  it('on one distinct value, even with a huge margin', () => {
    const a = assess(pts(Array(15).fill(3.2)), { ...base, target: { kind: 'margin', value: 100 } });
    expect(a.verdict).toMatchObject({ status: 'keep going', reason: 'one-distinct-value' });
  });
  it('on all-zero counts', () => {
    const a = assess(pts(Array(20).fill(0)), {
      ...base,
      kind: 'count',
      target: { kind: 'margin', value: 5 },
    });
    expect(a.verdict).toMatchObject({ status: 'keep going', reason: 'all-zero' });
  });
  it('on counts that are all the same', () => {
    const a = assess(pts(Array(20).fill(2)), {
      ...base,
      kind: 'count',
      target: { kind: 'margin', value: 5 },
    });
    expect(a.verdict).toMatchObject({ status: 'keep going', reason: 'one-distinct-value' });
  });
  it('without a target: interval only, more null', () => {
    const a = assess(pts(normal12), base);
    expect(a.verdict).toMatchObject({ status: 'keep going', reason: 'no-target' });
    expect(a.more).toBeNull();
  });
  it('pass/fail with none counted is decidable after the minimum (intervals do not rest on s)', () => {
    const a = assess(pts(Array(150).fill(0)), {
      ...base,
      kind: 'pass-fail',
      target: { kind: 'limit', value: 0.02 },
    });
    expect(a.verdict.status).toBe('below limit');
    expect(a.upper).toBeCloseTo(1 - 0.05 ** (1 / 150), 12);
    expect(a.method).toBe('clopper-pearson');
  });
});

describe('verdicts', () => {
  it('enough when the half-width meets the margin; more is null then', () => {
    const a = assess(pts(normal12), { ...base, target: { kind: 'margin', value: 5 } });
    expect(a.verdict.status).toBe('enough');
    expect(a.more).toBeNull();
  });
  it('limit: below / above by the one-sided bound on the estimate side', () => {
    const below = assess(pts(normal12), { ...base, target: { kind: 'limit', value: 60 } });
    expect(below.verdict.status).toBe('below limit');
    expect(below.sided).toBe('upper');
    expect(below.lower).toBeNull();
    const above = assess(pts(normal12), { ...base, target: { kind: 'limit', value: 40 } });
    expect(above.verdict.status).toBe('above limit');
    expect(above.sided).toBe('lower');
    const undecided = assess(pts(normal12), { ...base, target: { kind: 'limit', value: 50.5 } });
    expect(undecided.verdict).toMatchObject({ status: 'keep going', reason: 'undecided' });
  });
  it('precision is SE/mean, distinct from the relative half-width (r = z·D)', () => {
    const iv = { estimate: 10, lower: 8, upper: 12, se: 1 };
    expect(checkTarget({ kind: 'precision', value: 0.1 }, iv, 'two')).toBe('met');
    expect(checkTarget({ kind: 'relative', value: 0.1 }, iv, 'two')).toBe('not-met');
    expect(checkTarget({ kind: 'relative', value: 0.2 }, iv, 'two')).toBe('met');
  });
  it('names the method used, falling back to t with a warning when log methods meet a zero', () => {
    const a = assess(pts([0, ...normal12]), { ...base, method: 'cox' });
    expect(a.method).toBe('t');
    expect(a.warnings.join(' ')).toMatch(/above zero/);
    const b = assess(pts(normal12), { ...base, method: 'land', sided: 'upper' });
    expect(b.method).toBe('land');
    expect(b.methodLabel).toMatch(/Land/);
  });
  it('counts: exact Poisson unless overdispersed, dispersion index reported, density per area', () => {
    const pois = assess(pts([2, 1, 3, 2, 2, 1, 0, 4, 2, 3]), { ...base, kind: 'count', plotArea: 0.5 });
    expect(pois.method).toBe('poisson-exact');
    expect(pois.details.density).toBeCloseTo(4, 12);
    const clumped = assess(pts([0, 3, 1, 7, 0, 0, 2, 9, 1, 0, 4, 0, 5]), { ...base, kind: 'count' });
    expect(clumped.method).toBe('t');
    expect(clumped.details.dispersionIndex).toBeCloseTo(3.6302, 4);
    expect(clumped.lower!).toBeGreaterThanOrEqual(0);
  });
});

describe('how many more', () => {
  // totals from test/core/plan/sample-size.test.ts (scipy): likely 19.41, low 11.44, high 40.41, assured 37;
  // minus the 8 entries so far, rounded up: 12, 4, 33, 29 (a two-point sample has g₂ = −2: no Box widening)
  it('fixed point through the core: n = 8, s = 2, d = 1 → likely 12 more, 4–33, assured 29 [derived]', () => {
    // eight values with sd exactly 2: ±√(7/2)·… built from a symmetric pattern
    const k = Math.sqrt((4 * 7) / 8);
    const xs = [10 - k, 10 + k, 10 - k, 10 + k, 10 - k, 10 + k, 10 - k, 10 + k];
    const s = RunningSummary.of(xs);
    expect(s.sd).toBeCloseTo(2, 12);
    const a = assess(pts(xs), { ...base, min: 8, target: { kind: 'margin', value: 1 } });
    expect(a.more).toEqual({ likely: 12, low: 4, high: 33, assured: 29 });
  });
  it('monotone in the target: a tighter margin never needs fewer', () => {
    let prev = -1;
    for (const d of [3, 2, 1.5, 1, 0.7, 0.5, 0.3]) {
      const a = assess(pts(normal12), { ...base, target: { kind: 'margin', value: d } });
      const likely = a.more?.likely ?? 0;
      expect(likely).toBeGreaterThanOrEqual(prev);
      prev = likely;
      if (a.more) {
        expect(a.more.low).toBeLessThanOrEqual(a.more.likely);
        expect(a.more.high).toBeGreaterThanOrEqual(a.more.likely);
      }
    }
  });
  it('respects the population: never more than N − n', () => {
    const a = assess(pts(normal12), { ...base, population: 30, target: { kind: 'margin', value: 0.1 } });
    expect(a.more!.likely).toBeLessThanOrEqual(18);
    expect(a.more!.high).toBeLessThanOrEqual(18);
  });
  it('smoothing: the likely total moves by at most ±50 % of the previous raw total per entry, and says so', () => {
    const xs = [5, 5.2, 4.9, 5.1, 5, 5.05, 4.95, 5.1, 5, 4.9, 5, 9, 5.1, 1, 5, 12, 5, 5.1, 0.5, 5];
    const setup = { ...base, target: { kind: 'margin' as const, value: 0.4 } };
    const running = new RunningAssessment(setup);
    let prevRawTotal: number | null = null;
    let clamped = 0;
    for (const x of xs) {
      const a = running.add({ value: x });
      if (a.more === null || a.more.atLeast) {
        prevRawTotal = null;
        continue;
      }
      const total = a.n + a.more.likely;
      if (prevRawTotal !== null) {
        expect(total).toBeLessThanOrEqual(Math.ceil(prevRawTotal * 1.5));
        expect(total).toBeGreaterThanOrEqual(Math.min(a.n, Math.floor(prevRawTotal / 1.5)));
      }
      if (a.details.moreSmoothed === true) {
        clamped++;
        expect(a.details.moreRawLikely).not.toBe(a.more.likely);
      }
      const raw = typeof a.details.moreRawLikely === 'number' ? a.details.moreRawLikely : a.more.likely;
      prevRawTotal = Math.max(a.n, a.n + raw);
    }
    expect(clamped).toBeGreaterThan(1);
  });
  it('smoothing looks one entry back: assess() equals the entry-by-entry running chain (derived invariant)', () => {
    // A skewed sequence whose raw projection jumps, so the clamp acts on several consecutive entries.
    const xs = [5, 5.2, 4.9, 5.1, 5, 5.05, 4.95, 5.1, 5, 4.9, 5, 9, 5.1, 1, 5, 12, 5, 5.1, 0.5, 5];
    const setup = { ...base, target: { kind: 'margin' as const, value: 0.4 } };
    const running = new RunningAssessment(setup);
    for (const x of xs) running.add({ value: x });
    expect(assess(pts(xs), setup)).toEqual(running.assessment);
  });
  it('more: false skips only the projection; the interval, level and verdict are unchanged', () => {
    for (const rule of ['standard', 'strict', 'naive'] as const) {
      const setup = { ...base, rule, target: { kind: 'margin' as const, value: 0.2 } };
      const running = new RunningAssessment(setup, pts(normal12));
      const full = running.assessment;
      const lean = running.assessWith({ more: false });
      expect(full.more).not.toBeNull();
      expect(lean.more).toBeNull();
      expect([lean.estimate, lean.lower, lean.upper, lean.level]).toEqual([
        full.estimate,
        full.lower,
        full.upper,
        full.level,
      ]);
      expect(lean.verdict).toEqual(full.verdict);
    }
  });
  it('counts with a negative-binomial k: projection from the count model', () => {
    const counts = [0, 3, 1, 7, 0, 0, 2, 9, 1, 0, 4, 0, 5];
    const a = assess(pts(counts), {
      ...base,
      kind: 'count',
      method: 'quasi-poisson',
      planning: { negBinomialK: 0.5 },
      target: { kind: 'precision', value: 0.25 },
    });
    const m = counts.reduce((x, y) => x + y, 0) / counts.length;
    expect(a.more!.likely).toBe(Math.ceil((1 / m + 1 / 0.5) / 0.0625) - counts.length);
  });
  it('pass/fail margin: from the Agresti–Coull centre, range from the Wilson limits', () => {
    const xs = Array.from({ length: 60 }, (_, i) => (i % 6 === 0 ? 1 : 0));
    const a = assess(pts(xs), { ...base, kind: 'pass-fail', target: { kind: 'margin', value: 0.05 } });
    expect(a.more!.likely).toBeGreaterThan(100);
    expect(a.more!.low).toBeLessThan(a.more!.likely);
    expect(a.more!.high).toBeGreaterThan(a.more!.likely);
  });
});

describe('per-entry and batch paths agree', () => {
  it('a running assessment after a void equals assess on the remaining points', () => {
    const setup = { ...base, target: { kind: 'margin' as const, value: 1 } };
    const running = new RunningAssessment(
      setup,
      [...pts(normal12), { value: 99 }],
      [...normal12.map((_, i) => `e${i}`), 'odd'],
    );
    const a = running.void('odd');
    const b = assess(pts(normal12), setup);
    expect(a.lower).toBeCloseTo(b.lower!, 10);
    expect(a.upper).toBeCloseTo(b.upper!, 10);
    expect(a.verdict).toEqual(b.verdict);
  });
  it('refuses a level outside (0, 1) and n above the population', () => {
    expect(() => assess(pts(normal12), { ...base, level: 1 })).toThrow(RangeError);
    expect(() => assess(pts(normal12), { ...base, population: 5 })).toThrow(RangeError);
  });
});

describe('pass/fail with one outcome only: the exact one-sided bound on the open side', () => {
  // 59 conforming items out of 59: the one-sided 95 % lower bound is 0.05^(1/59) = 0.9504924 — the
  // "59 samples" rule of nonparametric tolerance limits (Wilks 1941, Ann. Math. Stat. 12:91–96; the same
  // figure as the one-sided Clopper–Pearson bound) [memory; derived: python3 -c "print(0.05**(1/59))"]
  it('all 59 items counted, lower bound: α^(1/n) = 0.9504924', () => {
    const a = assess(
      Array.from({ length: 59 }, () => ({ value: 1 })),
      { ...base, kind: 'pass-fail', sided: 'lower', target: { kind: 'limit', value: 0.9 } },
    );
    expect(a.lower).toBeCloseTo(0.05 ** (1 / 59), 12);
    expect(Math.abs(a.lower! - 0.9504924)).toBeLessThan(1e-7);
    expect(a.verdict.status).toBe('above limit');
  });
  it('mirrors nothing counted with an upper bound: 1 − α^(1/n)', () => {
    const none = assess(
      Array.from({ length: 59 }, () => ({ value: 0 })),
      { ...base, kind: 'pass-fail', sided: 'upper', target: { kind: 'limit', value: 0.1 } },
    );
    const all = assess(
      Array.from({ length: 59 }, () => ({ value: 1 })),
      { ...base, kind: 'pass-fail', sided: 'lower', target: { kind: 'limit', value: 0.9 } },
    );
    expect(none.upper).toBeCloseTo(1 - all.lower!, 14);
    expect(none.method).toBe(all.method);
  });
});

describe('how many more for a pass/fail limit decision', () => {
  // One counted item in 25, limit 10 %, one-sided 95 % (naive rule, so the checked level is the chosen one):
  // Wilson's bound clears the limit when n > z²·L(1 − L)/(p − L)² = 67.6 for p = 0.04 — checked against an
  // independent Wilson bound at fractional x: 0.10039 at n = 67 and 0.09978 at n = 68 [derived:
  //   python3 -c "from scipy.stats import norm; z=norm.ppf(0.95); print(z*z*0.09/(0.04-0.1)**2)"  → 67.6386]
  // so 43 more if the rate stays as observed (it said about 7,516 before, from a centre pulled onto the limit)
  it('one defect in 25 items, limit 10 %: about 43 more, and stable as the next items come', () => {
    const setup: AnalysisSetup = {
      ...base,
      kind: 'pass-fail',
      rule: 'naive',
      sided: 'upper',
      target: { kind: 'limit', value: 0.1 },
    };
    const items = Array.from({ length: 25 }, (_, i) => ({ value: i === 7 ? 1 : 0 }));
    const a = assess(items, setup);
    expect(a.verdict.status).toBe('keep going');
    expect(a.more?.likely).toBe(43);
    // two more good items: the figure moves a little, not by orders of magnitude
    const b = assess([...items, { value: 0 }, { value: 0 }], setup);
    expect(b.more!.likely).toBeGreaterThan(20);
    expect(b.more!.likely).toBeLessThan(43);
  });
  // A margin on a rare outcome projects from the median of the Jeffreys posterior Beta(x + ½, n − x + ½):
  // 1 in 40 → p̃ = 0.029324 [scipy: beta.ppf(0.5, 1.5, 39.5)], n = z²·p̃(1 − p̃)/d² = 121.49 for ±3 points at 95 %
  // [scipy: norm.ppf(0.975)**2 * p*(1-p) / 0.03**2], so 82 more (the Agresti–Coull centre (x + z²/2)/(n + z²) = 0.0666 said 226 more)
  it('one counted item in 40, margin ±3 points: about 82 more, from the Jeffreys median', () => {
    const items = Array.from({ length: 40 }, (_, i) => ({ value: i === 12 ? 1 : 0 }));
    const a = assess(items, { ...base, kind: 'pass-fail', target: { kind: 'margin', value: 0.03 } });
    expect(a.verdict.status).toBe('keep going');
    expect(a.more?.likely).toBe(82);
    expect(a.details.moreBasis).toMatch(/Jeffreys/);
  });
  it('never keep going with 0 more: 60 items, none counted, margin ±10 points', () => {
    // the margin is met on paper (Wilson's half-width at 0/60 is under 0.1), but one outcome only is never
    // `enough` for a margin target: the line said "keep going" and "0 more"
    const a = assess(
      Array.from({ length: 60 }, () => ({ value: 0 })),
      { ...base, kind: 'pass-fail', target: { kind: 'margin', value: 0.1 } },
    );
    expect(a.verdict.status).toBe('keep going');
    expect(a.more).toMatchObject({ likely: 1, atLeast: true });
    expect(a.details.moreFloor).toMatch(/at least one more/);
  });
});
