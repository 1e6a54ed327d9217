/**
 * Cost of replay's per-entry path, counted rather than timed (speed is never tested by a timed unit
 * test; the timings are in test/bench/coverage.md). The standard rule's internal level of counts and
 * log-scale measurements moves with the data (standard-level.ts), so a naive per-entry path inverts a
 * chi-square or t distribution at a new probability after every entry (it took 150–200 s for 20,000
 * sequences of 1,000 counts). The stop-only prefilter (standard.ts) must keep the number of numerical
 * quantile inversions far below the number of entries, while stopping exactly where the app's path does.
 * Evidence: invariants of the implementation (no external numbers needed).
 */
import { describe, expect, it } from 'vitest';
import { RunningAssessment, replaySequence } from '../../../src/assess/index.ts';
import type { AnalysisSetup } from '../../../src/model/types.ts';
import { quantileCacheMisses } from '../../../src/stats/quantile-cache.ts';
import { lognormalVariate } from '../../sim/lognormal-variate.ts';
import { negativeBinomialVariate } from '../../sim/negative-binomial-variate.ts';
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
