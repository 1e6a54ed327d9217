// The "how many more" caution shown in the setup (src/stop/rule-warnings.ts) states figures of the committed
// calibration run, test/bench/calibration.json (`npm run bench:coverage -- --r 2000 --calibration-only
// --calibration test/bench/calibration.md`): these tests recompute them from that file, so a new run that moves
// them fails here until the words are brought in line.
import { describe, expect, it } from 'vitest';
import type { AnalysisSetup } from '../../../src/model/types.ts';
import { ruleWarnings } from '../../../src/stop/rule-warnings.ts';
import calibration from '../../bench/calibration.json' with { type: 'json' };

type Stat = (typeof calibration.rows)[number]['stats'][number];
/** Checkpoints 10 and 20 with at least 100 runs still going (the table's own summary rule). */
function stats(models: RegExp, target: string): Stat[] {
  return calibration.rows
    .filter((r) => models.test(r.cell.split(' · ')[0] as string) && r.cell.endsWith(` · ${target}`))
    .flatMap((r) => r.stats.filter((s) => s.at !== 40 && s.runs >= 100));
}
const pct = (x: number) => Math.round(100 * x);
const lowestHeld = (xs: Stat[]) => pct(Math.min(...xs.map((s) => s.rangeHolds as number)));

const base: AnalysisSetup = { kind: 'measurement', level: 0.95, sided: 'two', rule: 'standard', min: 10 };
const caution = (setup: AnalysisSetup) =>
  ruleWarnings(setup).find((w) => w.startsWith('“How many more” is a planning figure')) ?? null;

describe('the how-many-more caution states the calibration run', () => {
  it('measurements, margin and relative: the lowest share held on skewed values and with a hot area', () => {
    const skewed = /^(lognormal|gamma)/;
    const hot = /^hot-spot/;
    const relative = lowestHeld(stats(skewed, 'relative'));
    const margin = lowestHeld([...stats(skewed, 'margin'), ...stats(hot, 'margin')]);
    const words = caution({ ...base, target: { kind: 'margin', value: 1 } });
    expect(words).toContain(`as few as ${Math.min(relative, margin)}–${Math.max(relative, margin)} %`);
  });
  it('counts, margin and relative: the lowest share held on clumped counts', () => {
    const clumped = /^(NB|zero)/;
    const margin = lowestHeld(stats(clumped, 'margin'));
    const relative = lowestHeld(stats(clumped, 'relative'));
    const words = caution({ ...base, kind: 'count', target: { kind: 'relative', value: 0.2 } });
    expect(words).toContain(`as few as ${margin}–${relative} %`);
  });
  it('limit on measurements: the span held on skewed values and the lowest likely/actual', () => {
    const skewed = stats(/^(lognormal|gamma)/, 'limit');
    const held = skewed.map((s) => pct(s.rangeHolds as number));
    const words = caution({ ...base, target: { kind: 'limit', value: 5 } });
    expect(words).toContain(`${Math.min(...held)}–${Math.max(...held)} %`);
    const lowestRatio = Math.min(...skewed.map((s) => s.medianRatio as number));
    expect(lowestRatio).toBeGreaterThan(0.3); // "as low as a third"
    expect(lowestRatio).toBeLessThan(0.4);
    expect(words).toContain('as low as a third');
  });
  it('pass/fail: a fifth before a limit, a third to twice for a margin or relative target on rare outcomes', () => {
    const rare = /^pass\/fail p 0\.0[125]$/;
    const limitRatio = Math.min(...stats(rare, 'limit').map((s) => s.medianRatio as number));
    expect(limitRatio).toBeGreaterThanOrEqual(0.2); // "as low as a fifth"
    expect(limitRatio).toBeLessThan(0.25);
    const ratios = [...stats(rare, 'margin'), ...stats(rare, 'relative')].map((s) => s.medianRatio as number);
    expect(Math.min(...ratios)).toBeGreaterThan(0.33); // "a third"
    expect(Math.min(...ratios)).toBeLessThan(0.4);
    expect(Math.max(...ratios)).toBeGreaterThan(1.9); // "twice"
    expect(Math.max(...ratios)).toBeLessThan(2.3);
    const pf = { ...base, kind: 'pass-fail' } as const;
    expect(caution({ ...pf, target: { kind: 'limit', value: 0.05 } })).toContain('as low as a fifth');
    expect(caution({ ...pf, target: { kind: 'margin', value: 0.05 } })).toContain(
      'between a third and twice',
    );
  });
  it('only the standard rule with a target projects, so only it is cautioned', () => {
    expect(caution({ ...base, rule: 'naive', target: { kind: 'margin', value: 1 } })).toBeNull();
    expect(caution(base)).toBeNull();
  });
});
