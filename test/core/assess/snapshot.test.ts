/**
 * A running assessment restored from its snapshot (src/assess/snapshot.ts) must be indistinguishable from
 * one rebuilt from the log: the same assessment and chart, the same result for every later entry, and the
 * same figures after a void. The reference is the pipeline's own rebuild from the counted entries (each
 * estimator is checked against its published source in the reference tests); what this file checks is
 * that the snapshot loses nothing — so the comparisons are exact (toEqual), not to a tolerance.
 * A snapshot that is not sound (wrong version, another setup, damaged parts) must be refused.
 *
 * The values are published data sets, named beside each case.
 */
import { describe, expect, it } from 'vitest';
import { RunningAssessment, SERIES_MAX } from '../../../src/assess/running.ts';
import { RUNNING_SNAPSHOT_VERSION, restoreRunning, snapshotRunning } from '../../../src/assess/snapshot.ts';
import type { StudySetup } from '../../../src/model/records.ts';
import type { Point } from '../../../src/model/types.ts';
import {
  heat,
  kicks,
  nonDetectEntries,
  strata,
  strataEntries,
  unitEntries,
} from '../../support/published-data.ts';

const base = { level: 0.95, sided: 'two', rule: 'standard', min: 10 } as const;
const cases: { name: string; setup: StudySetup; points: Point[] }[] = [
  {
    name: 'measurement, standard rule (ZARR13)',
    setup: { ...base, kind: 'measurement', unit: 'W/m2K', target: { kind: 'margin', value: 0.004 } },
    points: heat.map((value) => ({ value })),
  },
  {
    name: 'measurement, strict rule (ZARR13)',
    setup: {
      ...base,
      rule: 'strict',
      kind: 'measurement',
      unit: 'W/m2K',
      target: { kind: 'margin', value: 0.01 },
    },
    points: heat.map((value) => ({ value })),
  },
  {
    name: 'count, precision (Bortkiewicz), more than the chart holds',
    setup: {
      ...base,
      kind: 'count',
      plotArea: 1,
      plotAreaUnit: 'm2',
      target: { kind: 'precision', value: 0.05 },
    },
    points: kicks.map((value) => ({ value })),
  },
  {
    name: 'pass/fail, margin (ZARR13 above 9.26 counted)',
    setup: { ...base, kind: 'pass-fail', outcomeName: 'above 9.26', target: { kind: 'margin', value: 0.08 } },
    points: heat.map((v) => ({ value: v > 9.26 ? 1 : 0 })),
  },
  {
    name: 'pass/fail, limit (ZARR13 above 9.28 counted)',
    setup: { ...base, kind: 'pass-fail', outcomeName: 'above 9.28', target: { kind: 'limit', value: 0.3 } },
    points: heat.map((v) => ({ value: v > 9.28 ? 1 : 0 })),
  },
  {
    name: 'non-detects, Kaplan–Meier (USEPA 2009 Ex. 15-1)',
    setup: { ...base, kind: 'measurement', unit: 'ln(ug/L)', min: 8, target: { kind: 'limit', value: 4 } },
    points: [...nonDetectEntries],
  },
  {
    name: 'strata (Scheaffer et al. Ex. 5.1)',
    setup: {
      ...base,
      kind: 'measurement',
      unit: 'h',
      target: { kind: 'margin', value: 1 },
      strata: strata.map((s) => ({ name: s.name, weight: s.population })),
    },
    points: [...strataEntries],
  },
  {
    name: 'primary units (Scheaffer et al. Ex. 8.1)',
    setup: { ...base, kind: 'measurement', unit: 'USD', target: { kind: 'relative', value: 0.05 } },
    points: [...unitEntries],
  },
];

const keyOf = (i: number) => `entry-${i}`;

/** Through the structured clone, as IndexedDB stores it. */
const stored = (x: unknown) => structuredClone(x);

// Three cuts per case: just past the minimum, ten entries past it (where the pass/fail limit case's
// "how many more" is smoothed on the next entry, so the smoothing memory matters), and near the end (past
// SERIES_MAX entries where the case has them, so the chart has halved its points).
const cuts = cases.flatMap((c) =>
  [c.setup.min + 1, c.setup.min + 10, c.points.length - 15]
    .filter((cut, i, all) => cut > c.setup.min && cut < c.points.length - 1 && all.indexOf(cut) === i)
    .map((cut) => ({ ...c, cut })),
);

describe.each(cuts)('$name, snapshot after $cut entries', ({ setup, points, cut }) => {
  const head = points.slice(0, cut);
  const rebuilt = () =>
    new RunningAssessment(
      setup,
      head,
      head.map((_, i) => keyOf(i)),
    );

  it('restores the same assessment and chart as a rebuild from the entries', () => {
    const r = rebuilt();
    const restored = restoreRunning(setup, stored(snapshotRunning(r)));
    expect(restored).not.toBeNull();
    expect(restored?.assessment).toEqual(new RunningAssessment(setup, head).assessment);
    expect(restored?.series).toEqual(r.series);
    expect(restored?.n).toBe(head.length);
    expect(restored?.points()).toEqual(head);
  });

  it('every later entry, a void and a correction give exactly the results of the rebuilt assessment', () => {
    const r = rebuilt();
    const restored = restoreRunning(setup, stored(snapshotRunning(r))) as RunningAssessment;
    for (const [j, p] of points.slice(cut).entries()) {
      expect(restored.add(p, keyOf(cut + j))).toEqual(r.add(p, keyOf(cut + j)));
      expect(restored.series).toEqual(r.series);
    }
    expect(restored.void(keyOf(1))).toEqual(r.void(keyOf(1)));
    const again = points[2] as Point;
    expect(restored.correct(keyOf(2), again, 'c')).toEqual(r.correct(keyOf(2), again, 'c'));
    expect(restored.series).toEqual(r.series);
  });

  it('a snapshot of a restored assessment is the snapshot it came from', () => {
    const snap = snapshotRunning(rebuilt());
    expect(snapshotRunning(restoreRunning(setup, stored(snap)) as RunningAssessment)).toEqual(snap);
  });
});

describe('refuses a snapshot that is not sound', () => {
  const setup = cases[0]?.setup as StudySetup;
  const r = new RunningAssessment(
    setup,
    heat.slice(0, 30).map((value) => ({ value })),
    heat.slice(0, 30).map((_, i) => keyOf(i)),
  );
  const good = () =>
    stored(snapshotRunning(r)) as Record<string, unknown> & ReturnType<typeof snapshotRunning>;

  it('accepts the sound one (so that each refusal below is the damage, not the setup)', () => {
    expect(restoreRunning(setup, good())).not.toBeNull();
  });

  const damages: [string, (s: ReturnType<typeof good>) => unknown][] = [
    ['not an object', () => 'garbage'],
    ['null', () => null],
    ['another version', (s) => ({ ...s, version: RUNNING_SNAPSHOT_VERSION + 1 })],
    ['another setup', (s) => ({ ...s, setup: JSON.stringify({ ...setup, level: 0.9 }) })],
    ['a value lost', (s) => ({ ...s, values: s.values.slice(1) })],
    ['a value that is not a number', (s) => ({ ...s, values: ['1', ...s.values.slice(1)] })],
    ['an infinite value', (s) => ({ ...s, values: [Number.POSITIVE_INFINITY, ...s.values.slice(1)] })],
    ['a key lost', (s) => ({ ...s, keys: s.keys.slice(1) })],
    ['a mark beyond the entries', (s) => ({ ...s, marks: [[s.values.length, true, null, null]] })],
    ['a mark of the wrong shape', (s) => ({ ...s, marks: [[0, 'yes']] })],
    ['a stride that is no power of two', (s) => ({ ...s, stride: 3 })],
    [
      'a chart point beyond the entries',
      (s) => ({ ...s, sampled: [{ n: 31, estimate: 9, lower: 8, upper: 10 }] }),
    ],
    ['chart points out of order', (s) => ({ ...s, sampled: [...s.sampled].reverse() })],
    [
      'too many chart points',
      (s) => ({
        ...s,
        sampled: Array.from({ length: SERIES_MAX + 1 }, (_, i) => ({
          n: i + 1,
          estimate: 1,
          lower: 0,
          upper: 2,
        })),
      }),
    ],
    ['an assessment of another count', (s) => ({ ...s, current: { ...s.current, n: 29 } })],
    ['an assessment without its verdict', (s) => ({ ...s, current: { ...s.current, verdict: undefined } })],
    ['a smoothing memory that is not one', (s) => ({ ...s, memory: { n: 'x' } })],
  ];
  it.each(damages)('%s', (_, damage) => {
    expect(restoreRunning(setup, damage(good()))).toBeNull();
  });
});
