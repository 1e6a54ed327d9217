// Cluster ratio estimator against Scheaffer, Mendenhall & Ott, Elementary Survey Sampling, Example 8.2
// (test/fixtures/design-cluster.json: data [secondary], printed answer [memory], recomputation [derived]).
import { describe, expect, it } from 'vitest';
import { clusterRatioMean } from '../../../src/design/cluster-ratio-mean.ts';
import { designEffect } from '../../../src/design/design-effect.ts';
import fixture from '../../fixtures/design-cluster.json';

describe('clusterRatioMean — per-capita income, 25 blocks of 415', () => {
  const r = clusterRatioMean(fixture.clusters, fixture.populationClusters);
  it('reproduces the printed estimate, variance and bound', () => {
    if (r.status !== 'ok') throw new Error('expected ok');
    const t = fixture.printed.tolerance;
    expect(Math.abs(r.mean - fixture.printed.mean)).toBeLessThan(t.mean_abs);
    expect(Math.abs(r.variance - fixture.printed.variance)).toBeLessThan(t.variance_abs);
    expect(Math.abs(2 * r.se - fixture.printed.bound)).toBeLessThan(t.bound_abs);
    expect(r.df).toBe(24);
    expect(r.entries).toBe(151);
  });
  it('matches the python recomputation', () => {
    if (r.status !== 'ok') throw new Error('expected ok');
    expect(Math.abs(r.mean / fixture.derived.mean - 1)).toBeLessThan(fixture.derived.tolerance.rel);
    expect(Math.abs(r.variance / fixture.derived.variance - 1)).toBeLessThan(fixture.derived.tolerance.rel);
  });
});

describe('clusterRatioMean — invariants', () => {
  it('with one entry per cluster it is the simple mean and s/√n', () => {
    const xs = [4, 7, 1, 8, 5];
    const r = clusterRatioMean(xs.map((x) => ({ total: x, size: 1 })));
    if (r.status !== 'ok') throw new Error('expected ok');
    const m = 5;
    const s2 = xs.reduce((a, x) => a + (x - m) ** 2, 0) / 4;
    expect(r.mean).toBeCloseTo(m, 14);
    expect(r.variance).toBeCloseTo(s2 / 5, 14);
  });
  it('fewer than two primary units gives too-few; bad sizes throw', () => {
    expect(clusterRatioMean([{ total: 3, size: 2 }]).status).toBe('too-few');
    expect(() => clusterRatioMean([{ total: 3, size: 0 }])).toThrow(/size >= 1/);
    expect(() =>
      clusterRatioMean(
        [
          { total: 3, size: 1 },
          { total: 3, size: 1 },
        ],
        1,
      ),
    ).toThrow(RangeError);
  });
});

describe('designEffect', () => {
  it('identical entries within equal clusters: deff = (nm − 1)/(n − 1) (derived)', () => {
    // n = 5 transects of m = 4 quadrats, every quadrat on a transect equal to the transect mean.
    const means = [2, 5, 3, 8, 6];
    const m = 4;
    const values = means.flatMap((x) => Array(m).fill(x) as number[]);
    const r = clusterRatioMean(means.map((x) => ({ total: x * m, size: m })));
    if (r.status !== 'ok') throw new Error('expected ok');
    const mean = values.reduce((a, b) => a + b, 0) / values.length;
    const ev = values.reduce((a, b) => a + (b - mean) ** 2, 0) / (values.length - 1);
    const d = designEffect({ clusterVariance: r.variance, elementVariance: ev, entries: 20, meanSize: m });
    expect(d.deff).toBeCloseTo((5 * 4 - 1) / (5 - 1), 12);
    expect(d.effectiveN).toBeCloseTo(20 / d.deff, 12);
  });
  it('matches the @example and throws on bad input', () => {
    const d = designEffect({ clusterVariance: 0.3, elementVariance: 2, entries: 20, meanSize: 4 });
    expect(d.deff).toBeCloseTo(3, 12);
    expect(d.effectiveN).toBeCloseTo(20 / 3, 12);
    expect(d.rho).toBeCloseTo(2 / 3, 12);
    // ρ is clipped to at most 1
    expect(designEffect({ clusterVariance: 0.5, elementVariance: 2, entries: 20, meanSize: 4 }).rho).toBe(1);
    expect(() => designEffect({ clusterVariance: 1, elementVariance: 0, entries: 5, meanSize: 2 })).toThrow(
      RangeError,
    );
  });
});
