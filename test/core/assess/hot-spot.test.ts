// Hot spots (issue 12, item 2): the minimum before a verdict follows from the detection probability
// 1 − (1 − share)^n ≥ 0.95 (src/stats/hot-spot-detection.ts, src/stop/minimum.ts); the share n entries could
// still have missed is 1 − 0.05^(1/n); a value that doubles the spread is flagged (src/assess/entries.ts).
// Expected counts and shares come from test/fixtures/hot-spot-detection.json, made by scipy.stats.binom
// (counting n up, and brentq) — `python3 test/fixtures/hot-spot-detection.py` [derived, scipy].
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { assess } from '../../../src/assess/index.ts';
import type { StudySetup } from '../../../src/model/records.ts';
import type { AnalysisSetup, Point } from '../../../src/model/types.ts';
import { hotSpotDetection } from '../../../src/stats/hot-spot-detection.ts';
import { minimumBeforeVerdict } from '../../../src/stop/minimum.ts';
import { doneWords, minimumWords, spreadJumpWords, unseenWords } from '../../../src/words/index.ts';
import fixture from '../../fixtures/hot-spot-detection.json' with { type: 'json' };

const root = join(import.meta.dirname, '..', '..', '..');
const bin = join(root, 'src', 'cli', 'bin.mjs');
const pts = (xs: number[]): Point[] => xs.map((value) => ({ value }));
// no hot-spot share given: the default 10 % applies
const base: AnalysisSetup = { kind: 'measurement', level: 0.95, sided: 'two', rule: 'standard', min: 10 };
// 40 values near 50 (a fixed, unremarkable sequence: 50 ± a few tenths)
const calm = Array.from({ length: 40 }, (_, i) => 50 + ((i * 7) % 11) / 10 - 0.5);

describe('entries that find a hot area of a given share with 95 % probability', () => {
  it.each(fixture.entries)('share $share → $n entries (scipy, counted up)', ({ share, n }) => {
    expect(hotSpotDetection.entriesFor(share)).toBe(n);
  });
  it.each(fixture.unseen)(
    'n = $n → an area of $share could still be missed (scipy brentq)',
    ({ n, share }) => {
      expect(Math.abs(hotSpotDetection.unseenShare(n) - share)).toBeLessThan(1e-12);
    },
  );
  it('refuses a share of nothing or of everything', () => {
    expect(() => hotSpotDetection.entriesFor(0)).toThrow(RangeError);
    expect(() => hotSpotDetection.entriesFor(1)).toThrow(RangeError);
  });
});

describe('the minimum before a verdict', () => {
  it('is the larger of min and the hot-spot entries; the default share is 10 % (29 entries)', () => {
    const n10 = fixture.entries.find((e) => e.share === 0.1)!.n;
    const n20 = fixture.entries.find((e) => e.share === 0.2)!.n;
    expect(minimumBeforeVerdict(base)).toBe(n10);
    expect(minimumBeforeVerdict({ ...base, hotSpotShare: 0.2 })).toBe(Math.max(10, n20));
    expect(minimumBeforeVerdict({ ...base, min: 40 })).toBe(40);
    expect(minimumBeforeVerdict({ ...base, hotSpotShare: 0.5 })).toBe(10);
  });
  it('no verdict before 29 entries by default, with the reason; enough at 29 on a loose target', () => {
    const setup = { ...base, target: { kind: 'margin', value: 100 } } as const;
    const before = assess(pts(calm.slice(0, 28)), setup);
    expect(before.verdict).toMatchObject({ status: 'keep going', reason: 'below-minimum' });
    expect(before.verdict.message).toMatch(/29 entries.*10 % of the site/);
    expect(before.more).toMatchObject({ likely: 1, atLeast: true });
    const at = assess(pts(calm.slice(0, 29)), setup);
    expect(at.verdict.status).toBe('enough');
    expect(at.details.minimum).toBe(29);
    const s29 = fixture.unseen.find((u) => u.n === 29)!.share;
    expect(Math.abs((at.details.unseenShare as number) - s29)).toBeLessThan(1e-12);
  });
  it('pass/fail lots: the same minimum for the share of items (the zero-acceptance plan)', () => {
    const setup: AnalysisSetup = {
      ...base,
      kind: 'pass-fail',
      target: { kind: 'margin', value: 0.9 },
      hotSpotShare: 0.05,
    };
    const xs = Array.from({ length: 70 }, (_, i) => (i % 2 === 0 ? 1 : 0));
    const n5 = fixture.entries.find((e) => e.share === 0.05)!.n;
    expect(assess(pts(xs.slice(0, n5 - 1)), setup).verdict.status).toBe('keep going');
    expect(assess(pts(xs.slice(0, n5)), setup).verdict.status).toBe('enough');
  });
  it('the command line reads --hot-spot-share as a fraction or a percentage', () => {
    for (const share of ['0.2', '20%']) {
      const p = spawnSync(
        process.execPath,
        [bin, 'assess', '--kind', 'measurement', '--hot-spot-share', share],
        {
          input: `${calm.join('\n')}\n`,
          encoding: 'utf8',
          cwd: root,
        },
      );
      expect(p.stderr).toBe('');
      const out = JSON.parse(p.stdout);
      expect(out.details.minimum).toBe(fixture.entries.find((e) => e.share === 0.2)!.n);
    }
  });
});

describe('a value that doubles the spread is flagged', () => {
  // SD by the textbook two-pass formula, written here (not the code under test)
  const sd = (xs: number[]) => {
    const m = xs.reduce((a, b) => a + b, 0) / xs.length;
    return Math.sqrt(xs.reduce((a, b) => a + (b - m) ** 2, 0) / (xs.length - 1));
  };
  it('one far value after 15 calm ones: flagged at entry 16 with the SD ratio, in the warnings and words', () => {
    const xs = [...calm.slice(0, 15), 58, ...calm.slice(15, 20)];
    const ratio = sd(xs.slice(0, 16)) / sd(xs.slice(0, 15));
    expect(ratio).toBeGreaterThan(2);
    const a = assess(pts(xs), base);
    expect(a.details.spreadJumpEntry).toBe(16);
    expect(a.details.spreadJumpValue).toBe(58);
    expect(Math.abs((a.details.spreadJumpRatio as number) - ratio)).toBeLessThan(1e-9);
    expect(a.warnings.some((w) => w.startsWith('HOT SPOT? Entry 16 (58)'))).toBe(true);
    const setup = { ...base, unit: 'mg/kg' } as StudySetup;
    expect(spreadJumpWords(a, ',')).toMatch(/^Possible hot spot: entry 16 \(58\)/);
    expect(minimumWords(a, setup)).toMatch(/^29 entries \(an area of 10 % of the site/);
  });
  it('not for a value that raises the SD by less than twice, nor before 10 entries', () => {
    const mild = [...calm.slice(0, 15), 52];
    expect(sd(mild) / sd(mild.slice(0, 15))).toBeLessThan(2);
    expect(assess(pts(mild), base).details.spreadJumpEntry).toBeUndefined();
    const early = [...calm.slice(0, 8), 500];
    expect(assess(pts(early), base).details.spreadJumpEntry).toBeUndefined();
  });
  it('not for pass/fail items (the first defect is no jump in a site’s values)', () => {
    const xs = [...Array(20).fill(0), 1];
    expect(assess(pts(xs), { ...base, kind: 'pass-fail' }).details.spreadJumpEntry).toBeUndefined();
  });
});

describe('what could still be unseen, in words', () => {
  it('after 29 entries: about 10 % of the site; a reached verdict says so', () => {
    const a = assess(pts(calm.slice(0, 29)), { ...base, target: { kind: 'margin', value: 100 } });
    expect(unseenWords(a)).toBe(
      'An area of up to about 10 % of the site could still be unseen: 29 random entries all miss an area that size 1 time in 20.',
    );
    expect(doneWords(a)).toContain('about 10 % of the site could still be unseen');
  });
  it('after 100 pass/fail items: about 3 % of the lot’s items (1 − 0.05^(1/100) = 0.0295)', () => {
    const xs = Array.from({ length: 100 }, (_, i) => (i % 3 === 0 ? 1 : 0));
    const a = assess(pts(xs), { ...base, kind: 'pass-fail' });
    expect(unseenWords(a, ',')).toMatch(/^A group of up to about 3 % of the lot’s items/);
  });
});
