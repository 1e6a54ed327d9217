/**
 * Cost of replay's per-entry path, counted rather than timed (speed is never tested by a timed unit
 * test; the timings are in test/bench/replay-bench.md, from `npm run bench:replay`). The standard rule's internal level of counts and
 * log-scale measurements moves with the data (standard-level.ts), so a naive per-entry path inverts a
 * chi-square or t distribution at a new probability after every entry (it took 150–200 s for 20,000
 * sequences of 1,000 counts). The stop-only prefilter (standard.ts) must keep the number of numerical
 * quantile inversions far below the number of entries, while stopping exactly where the app's path does.
 * Evidence: invariants of the implementation (no external numbers needed).
 */
import { describe, expect, it } from 'vitest';
import { RunningAssessment, replaySequence } from '../../../src/assess/index.ts';
import type { AnalysisSetup } from '../../../src/model/types.ts';
import { landHSolves } from '../../../src/stats/land-interval.ts';
import { quantileCacheMisses } from '../../../src/stats/quantile-cache.ts';
import { lognormalVariate } from '../../sim/lognormal-variate.ts';
import { negativeBinomialVariate } from '../../sim/negative-binomial-variate.ts';
import { poissonVariate } from '../../sim/poisson-variate.ts';
import { createRng } from '../../sim/xoshiro128.ts';

const base = { level: 0.95, sided: 'two', rule: 'standard', min: 10 } as const;
const cases: { name: string; setup: AnalysisSetup; draw: (g: ReturnType<typeof createRng>) => number }[] = [
  {
    name: 'clumped counts (t interval at a dispersion-dependent level)',
    setup: { ...base, kind: 'count', target: { kind: 'relative', value: 0.001 } },
    draw: (g) => negativeBinomialVariate(g, 2, 2),
  },
  {
    name: 'near-Poisson counts (exact Poisson interval, level moves whenever I > 1)',
    setup: { ...base, kind: 'count', target: { kind: 'relative', value: 0.001 } },
    draw: (g) => negativeBinomialVariate(g, 2, 200),
  },
  {
    name: 'log-scale (Cox) measurements (level moves with the log SD)',
    setup: { ...base, kind: 'measurement', method: 'cox', target: { kind: 'relative', value: 0.0001 } },
    draw: (g) => lognormalVariate(g, 1, 1),
  },
];

describe('replay: quantile inversions per entry (never-stopping sequences)', () => {
  for (const c of cases)
    it(`${c.name}: far fewer inversions than entries, same verdicts as the app's path`, () => {
      const rng = createRng(2024);
      const runs = 40;
      const length = 300;
      const draw = () => Array.from({ length: runs }, () => Array.from({ length }, () => c.draw(rng)));
      // a first batch fills the quantile cache (one inversion per degrees of freedom met)
      for (const seq of draw()) replaySequence(seq, c.setup);
      const seqs = draw();
      const before = quantileCacheMisses();
      for (const seq of seqs) expect(replaySequence(seq, c.setup).stoppedAt).toBeNull();
      const inversions = quantileCacheMisses() - before;
      // the second batch's ~11,600 entries past the minimum would each cost one or two inversions without
      // the prefilter; with it only the final full assessment of each sequence (a few) and rare new df
      expect(inversions).toBeLessThan(runs * 8);
      // the prefilter never changes a verdict: the app's per-entry path agrees at every entry of one run
      const running = new RunningAssessment(c.setup);
      for (const v of seqs[0] as number[]) {
        running.addValue(v);
        expect(running.assessWith({ projection: false }).verdict.status).toBe('keep going');
      }
    });
});

describe('replay: one long count sequence costs O(1) per entry (no inversion at each new total)', () => {
  // Each count entry brings a new total, so the exact Poisson interval and the dispersion test would ask a
  // chi-square quantile at new degrees of freedom every time (an O(total) inversion in jstat: 117 s for one
  // sequence of 100,000 counts). With the Wilson–Hilferty bracket they are asked only where it cannot
  // settle the answer.
  const base = { kind: 'count', level: 0.95, min: 10, target: { kind: 'relative', value: 1e-4 } } as const;
  const setups: { name: string; setup: AnalysisSetup }[] = [
    { name: 'default method, standard rule', setup: { ...base, sided: 'two', rule: 'standard' } },
    {
      name: 'exact Poisson, naive rule, upper bound',
      setup: { ...base, sided: 'upper', rule: 'naive', method: 'poisson-exact' },
    },
  ];
  for (const { name, setup } of setups)
    it(`${name}: 20,000 Poisson counts never stop and ask a handful of inversions`, () => {
      const rng = createRng(99);
      const values = Array.from({ length: 20_000 }, () => poissonVariate(rng, 2));
      const before = quantileCacheMisses();
      expect(replaySequence(values, setup).stoppedAt).toBeNull();
      // the final full assessment asks a few; the per-entry path asks almost none
      expect(quantileCacheMisses() - before).toBeLessThan(50);
    });
  it('the bracket never changes a verdict: near the target, replay stops where the app first stops', () => {
    const rng = createRng(5);
    const setup: AnalysisSetup = {
      ...base,
      sided: 'two',
      rule: 'standard',
      target: { kind: 'relative', value: 0.06 },
    };
    let stopped = 0;
    for (let r = 0; r < 6; r++) {
      const values = Array.from({ length: 2500 }, () => poissonVariate(rng, 2));
      const fast = replaySequence(values, setup).stoppedAt;
      const running = new RunningAssessment(setup);
      let first: number | null = null;
      for (const v of values) {
        running.addValue(v);
        if (running.assessWith({ projection: false }).verdict.status !== 'keep going') {
          first = running.n;
          break;
        }
      }
      expect(fast).toBe(first);
      if (fast !== null) stopped++;
    }
    expect(stopped).toBeGreaterThan(3);
  });
});

describe("replay: Land's method solves for H at few entries", () => {
  it('a second batch of never-stopping sequences solves a small fraction of the factors it would without the table', () => {
    const setup: AnalysisSetup = {
      kind: 'measurement',
      method: 'land',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      min: 10,
      target: { kind: 'relative', value: 0.04 },
    };
    const rng = createRng(31);
    const batch = () =>
      Array.from({ length: 30 }, () => Array.from({ length: 300 }, () => lognormalVariate(rng, 1, 1)));
    // the first batch fills the table of nodes (land-inner-bounds.ts)
    for (const seq of batch()) replaySequence(seq, setup);
    const seqs = batch();
    const before = landHSolves();
    let entries = 0;
    for (const seq of seqs) entries += replaySequence(seq, setup).stoppedAt ?? seq.length;
    // without the table each entry past the minimum solves two factors (four with the floor prefilter); the
    // table's nodes are shared by all sequences, so the share falls further as the batch grows (the replay
    // benchmark: test/bench/replay-bench.md)
    expect(landHSolves() - before).toBeLessThan(entries / 3);
  });
});
