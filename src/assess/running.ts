/**
 * The one running assessment: a study's counted entries in entry order → the current assessment and the
 * running series the chart draws. The phone session, the report file, `assess` and `replay` all use it, so
 * every surface computes the same figures from the same entries.
 *
 * - `add(point, key?)`: O(1) for the data kinds (see subject.ts for each design's cost); returns the new
 *   assessment, smoothed one entry back (more.ts).
 * - `void(key)` and `correct(key, point, newKey?)`: a correction never deletes; the withdrawn entry leaves the
 *   figures and the state is rebuilt from the entries that still count (O(n), rare).
 * - Loading n entries at once (constructor) costs n O(1) adds plus at most SERIES_MAX + 2 assessments: the
 *   chart's points need the interval only, and "how many more" needs the last two entries only.
 * The result after any history is a function of the counted entries in order, nothing else.
 */
import { assertSetup } from '../model/setup.ts';
import type { AnalysisSetup, Assessment, Point } from '../model/types.ts';
import { EntryState } from './entries.ts';
import type { MoreMemory } from './more.ts';
import { type AssessOptions, runPipeline } from './pipeline.ts';
import { subjectOf } from './subject.ts';

/** One point of the running chart: the interval after n counted entries (null: that side is unbounded). */
export interface SeriesPoint {
  n: number;
  estimate: number;
  lower: number | null;
  upper: number | null;
}

/** The chart keeps at most this many points: when full, every other one is dropped (the stride doubles). */
export const SERIES_MAX = 160;

/** The state a running assessment carries beside its counted entries (see `carried()`). */
export interface RunningCarried {
  /** The entries' keys (entry ids), in entry order. */
  keys: (string | null)[];
  memory: MoreMemory | null;
  current: Assessment | null;
  stride: number;
  sampled: SeriesPoint[];
  latest: SeriesPoint | null;
}

interface Entry {
  key: string | null;
  point: Point;
}

export class RunningAssessment {
  private entries: Entry[] = [];
  private state: EntryState;
  private memory: MoreMemory | null = null;
  private current: Assessment | null = null;
  private stride = 1;
  /** Chart points at every `stride`-th entry. */
  private sampled: SeriesPoint[] = [];
  /** The latest entry's point, so the chart always ends at the current interval. */
  private latest: SeriesPoint | null = null;

  constructor(
    readonly setup: AnalysisSetup,
    points: readonly Point[] = [],
    keys?: readonly string[],
  ) {
    assertSetup(setup);
    this.state = new EntryState(setup);
    this.rebuild(points.map((point, i) => ({ key: keys?.[i] ?? null, point })));
  }

  /** The running chart: sampled points, always ending at the latest entry that has an interval. */
  get series(): SeriesPoint[] {
    const latest = this.latest;
    if (latest === null || this.sampled.at(-1)?.n === latest.n) return this.sampled;
    return [...this.sampled, latest];
  }

  /** Counted entries. */
  get n(): number {
    return this.entries.length;
  }

  /** The running sums behind the figures (replay's verdict-only loop reads them; do not mutate). */
  get entryState(): EntryState {
    return this.state;
  }

  /** Replay's hot path: counts a plain value without assessing (no key, no chart point). */
  addValue(value: number): void {
    this.entries.push({ key: null, point: { value } });
    this.state.addValue(value);
    this.current = null;
  }

  /** The assessment after the last counted entry (computed on first read after a change). */
  get assessment(): Assessment {
    this.current ??= this.assessNow();
    return this.current;
  }

  /** A fresh assessment of the entries so far with other options (replay: verdict only). */
  assessWith(options: AssessOptions): Assessment {
    return runPipeline(subjectOf(this.state, this.setup), this.setup, { ...options, memory: this.memory })
      .assessment;
  }

  /** Adds one counted entry; returns the new assessment. */
  add(point: Point, key: string | null = null): Assessment {
    this.entries.push({ key, point });
    this.state.add(point);
    const a = this.assessNow();
    this.pushSeries(a);
    return a;
  }

  /** Withdraws the entry filed under `key` (a void); the figures no longer count it. */
  void(key: string): Assessment {
    const at = this.entries.findIndex((e) => e.key === key);
    if (at < 0) throw new RangeError(`void requires an entry with key ${key}`);
    this.rebuild(this.entries.filter((_, i) => i !== at));
    return this.assessment;
  }

  /** A correction: the entry under `key` is withdrawn and the corrected value counted as a new entry. */
  correct(key: string, point: Point, newKey: string | null = null): Assessment {
    this.void(key);
    return this.add(point, newKey);
  }

  /**
   * Everything beyond the counted entries that the figures carry forward (the chart's sampling and the
   * smoothing memory): snapshot.ts stores it so that a restored assessment continues exactly as this one.
   */
  carried(): RunningCarried {
    return {
      keys: this.entries.map((e) => e.key),
      memory: this.memory === null ? null : { ...this.memory },
      current: this.current,
      stride: this.stride,
      sampled: this.sampled.map((p) => ({ ...p })),
      latest: this.latest === null ? null : { ...this.latest },
    };
  }

  /**
   * A running assessment from its counted entries and what `carried()` gave: the entries are counted again
   * with the O(1) running-sum update only (no pipeline run), so the sums are exactly those of a rebuild;
   * the assessment, the smoothing memory and the chart are taken as stored. snapshot.ts checks the parts.
   */
  static resumed(setup: AnalysisSetup, points: readonly Point[], carried: RunningCarried): RunningAssessment {
    const r = new RunningAssessment(setup);
    for (const [i, point] of points.entries()) {
      r.entries.push({ key: carried.keys[i] ?? null, point });
      r.state.add(point);
    }
    r.memory = carried.memory;
    r.current = carried.current;
    r.stride = carried.stride;
    r.sampled = carried.sampled;
    r.latest = carried.latest;
    return r;
  }

  /** The counted points in entry order (the strata panel and the exports read them). */
  points(): Point[] {
    return this.entries.map((e) => e.point);
  }

  private assessNow(): Assessment {
    const r = runPipeline(subjectOf(this.state, this.setup), this.setup, { memory: this.memory });
    this.memory = r.memory;
    this.current = r.assessment;
    return r.assessment;
  }

  private pushSeries(a: Assessment): void {
    if (a.estimate === null || (a.lower === null && a.upper === null)) {
      if (a.n === this.entries.length) this.latest = null;
      return;
    }
    const point = { n: a.n, estimate: a.estimate, lower: a.lower, upper: a.upper };
    if (a.n === this.entries.length) this.latest = point;
    if (a.n % this.stride !== 0) return;
    this.sampled.push(point);
    if (this.sampled.length > SERIES_MAX) {
      this.stride *= 2;
      this.sampled = this.sampled.filter((p) => p.n % this.stride === 0);
    }
  }

  private rebuild(entries: Entry[]): void {
    this.entries = [];
    this.state = new EntryState(this.setup);
    this.memory = null;
    this.current = null;
    this.sampled = [];
    this.latest = null;
    this.stride = 1;
    while (entries.length / this.stride > SERIES_MAX) this.stride *= 2;
    const last = entries.length - 1;
    entries.forEach((e, i) => {
      this.entries.push(e);
      this.state.add(e.point);
      if (i >= last - 1) {
        // the smoothed "more" looks one entry back: the last two entries get the full assessment
        this.pushSeries(this.assessNow());
      } else if (this.entries.length % this.stride === 0) {
        // a chart point needs the interval only, not the costly projection
        const r = runPipeline(subjectOf(this.state, this.setup), this.setup, { more: false });
        this.pushSeries(r.assessment);
      }
    });
    if (entries.length === 0) this.current = null;
  }
}
