/**
 * The coverage benchmark's grid (issue 12, item 3): every data model × target × oracle size n*.
 *
 * Data models (mean μ, SD σ, from their definitions):
 * - measurements: normal μ = 10, σ = 1; lognormal mean 1, CV 0.5, 1, 2, 3 (σ = CV); gamma shape 0.5, 1, 2,
 *   scale 1 (μ = k, σ = √k); a two-population hot-spot mixture, share π = 5 % and 15 % of values from a
 *   lognormal of mean 10, CV 0.5, the rest from a lognormal of mean 1, CV 0.5 (μ = 1 + 9π,
 *   E X² = (1 − π)·1.25 + π·125);
 * - counts: Poisson λ = 2; negative binomial m = 2, k = 0.5 and 2 (σ² = m + m²/k); zero-inflated Poisson,
 *   half the plots empty, the rest Poisson λ = 4 (μ = 2, σ² = 0.5·(4 + 16) − 4 = 6);
 * - pass/fail: p = 0.01, 0.02, 0.05, 0.1, 0.2, 0.5.
 * Targets from n* (z = 1.96, z₁ = 1.645): margin d = z·σ/√n*; relative r = z·(σ/μ)/√n* (cells where r > 1
 * are left out: a relative target is a fraction of the estimate below 1); limit L = μ + z₁·σ/√n* (the truth
 * is below the limit, so "below limit" is the right decision and the reported upper bound should hold μ).
 * n* = 25, 50, 100 for measurements and counts; 100 and 400 for pass/fail.
 */
import type { AnalysisSetup, DataKind, Target } from '../../src/model/types.ts';
import { bernoulliVariate } from '../sim/bernoulli-variate.ts';
import { gammaVariate } from '../sim/gamma-variate.ts';
import { lognormalVariate } from '../sim/lognormal-variate.ts';
import { negativeBinomialVariate } from '../sim/negative-binomial-variate.ts';
import { normalVariate } from '../sim/normal-variate.ts';
import { poissonVariate } from '../sim/poisson-variate.ts';
import type { Rng } from '../sim/xoshiro128.ts';

export const LEVEL = 0.95;
const Z = 1.959963984540054;
const Z1 = 1.6448536269514722;

export interface Model {
  name: string;
  kind: DataKind;
  mean: number;
  sd: number;
  draw: (rng: Rng) => number;
}

export interface Cell {
  name: string;
  model: Model;
  target: Target['kind'];
  kind: DataKind;
  nStar: number;
  truth: number;
  draw: (rng: Rng) => number;
  /** The default setup: standard rule, minimum 10, the default hot-spot share and method. */
  base: AnalysisSetup;
  seed: number;
}

function mixture(share: number): Model {
  const mean = 1 + 9 * share;
  const ex2 = (1 - share) * 1.25 + share * 125;
  return {
    name: `hot-spot mixture ${share * 100} %`,
    kind: 'measurement',
    mean,
    sd: Math.sqrt(ex2 - mean * mean),
    draw: (g) => (g.next() < share ? lognormalVariate(g, 10, 0.5) : lognormalVariate(g, 1, 0.5)),
  };
}

export const MODELS: readonly Model[] = [
  { name: 'normal', kind: 'measurement', mean: 10, sd: 1, draw: (g) => normalVariate(g, 10, 1) },
  ...[0.5, 1, 2, 3].map(
    (cv): Model => ({
      name: `lognormal CV ${cv}`,
      kind: 'measurement',
      mean: 1,
      sd: cv,
      draw: (g) => lognormalVariate(g, 1, cv),
    }),
  ),
  ...[0.5, 1, 2].map(
    (k): Model => ({
      name: `gamma k ${k}`,
      kind: 'measurement',
      mean: k,
      sd: Math.sqrt(k),
      draw: (g) => gammaVariate(g, k),
    }),
  ),
  mixture(0.05),
  mixture(0.15),
  { name: 'Poisson λ 2', kind: 'count', mean: 2, sd: Math.sqrt(2), draw: (g) => poissonVariate(g, 2) },
  ...[0.5, 2].map(
    (k): Model => ({
      name: `NB m 2 k ${k}`,
      kind: 'count',
      mean: 2,
      sd: Math.sqrt(2 + 4 / k),
      draw: (g) => negativeBinomialVariate(g, 2, k),
    }),
  ),
  {
    name: 'zero-inflated Poisson',
    kind: 'count',
    mean: 2,
    sd: Math.sqrt(6),
    draw: (g) => (g.next() < 0.5 ? 0 : poissonVariate(g, 4)),
  },
  ...[0.01, 0.02, 0.05, 0.1, 0.2, 0.5].map(
    (p): Model => ({
      name: `pass/fail p ${p}`,
      kind: 'pass-fail',
      mean: p,
      sd: Math.sqrt(p * (1 - p)),
      draw: (g) => bernoulliVariate(g, p),
    }),
  ),
];

export function targetFor(m: Model, kind: Target['kind'], nStar: number): Target | null {
  const root = Math.sqrt(nStar);
  if (kind === 'margin') return { kind, value: (Z * m.sd) / root };
  if (kind === 'relative') {
    const r = (Z * m.sd) / m.mean / root;
    return r < 1 ? { kind, value: r } : null;
  }
  if (kind === 'limit') {
    const l = m.mean + (Z1 * m.sd) / root;
    return m.kind === 'pass-fail' && !(l < 1) ? null : { kind, value: l };
  }
  return null;
}

export function buildGrid(only?: (m: Model) => boolean): Cell[] {
  const cells: Cell[] = [];
  let seed = 20000;
  for (const model of MODELS) {
    if (only && !only(model)) continue;
    const sizes = model.kind === 'pass-fail' ? [100, 400] : [25, 50, 100];
    for (const target of ['margin', 'relative', 'limit'] as const)
      for (const nStar of sizes) {
        const t = targetFor(model, target, nStar);
        seed++;
        if (t === null) continue;
        cells.push({
          name: `${model.name} · ${target}`,
          model,
          target,
          kind: model.kind,
          nStar,
          truth: model.mean,
          draw: model.draw,
          base: { kind: model.kind, level: LEVEL, sided: 'two', rule: 'standard', min: 10, target: t },
          seed,
        });
      }
  }
  return cells;
}
