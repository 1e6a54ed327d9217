/**
 * One open study in memory: its event log, the core's running summary, the current assessment, a
 * downsampled running series for the chart, and the pace. Applying a new entry is O(1) (O(log n) for
 * the pace median); a void removes one point from the summary in O(1) and rebuilds only the chart series.
 * All statistics come from the core (assessSummary); nothing here computes an interval. A session is
 * only constructed after `loadCore()` resolved (see web/core-loader.ts).
 */
import type { Assessment, ObservationRecord, Point, RunningSummary } from '../core.ts';
import { loadedCore } from '../core-loader.ts';
import type { StoredStudy } from '../storage/schema.ts';
import { Pace } from './pace.ts';

export interface SeriesPoint {
  n: number;
  estimate: number;
  lower: number;
  upper: number;
}

/** The chart keeps at most this many points: when full, every other one is dropped (stride doubles). */
const SERIES_MAX = 160;

export function pointOf(rec: ObservationRecord): Point {
  const p: Point = { value: rec.value as number };
  if (rec.censored) p.censored = true;
  if (rec.stratum !== undefined) p.stratum = rec.stratum;
  if (rec.cluster !== undefined) p.cluster = rec.cluster;
  return p;
}

export class StudySession {
  readonly records: ObservationRecord[] = [];
  /** entry id → the void record that withdrew it. */
  readonly voidOf = new Map<string, ObservationRecord>();
  private readonly byId = new Map<string, ObservationRecord>();
  private summary: RunningSummary = new (loadedCore().RunningSummary)();
  /** Counted uncensored values in entry order (the stopping rules may look back). */
  private values: number[] = [];
  /** Counted points in entry order, for the design-aware estimates (web/design, issue 7; O(n) per entry). */
  private points: Point[] = [];
  /** Some entry is a non-detect or names a primary unit, so the design-aware estimate applies. */
  private designPoints = false;
  /** The previous entry's assessment: the core smooths "how many more" one entry back, as `assess` does. */
  private previous: Assessment | null = null;
  private stride = 1;
  series: SeriesPoint[] = [];
  readonly pace = new Pace();
  assessment!: Assessment;

  constructor(
    readonly study: StoredStudy,
    records: readonly ObservationRecord[] = [],
  ) {
    for (const r of records) this.ingest(r);
    this.replay();
  }

  /** Counted entries (not voided). */
  get n(): number {
    return this.summary.n + this.summary.censored;
  }

  get lastSeq(): number {
    return this.records.at(-1)?.seq ?? 0;
  }

  isVoided(id: string): boolean {
    return this.voidOf.has(id);
  }

  /** The most recent entry that still counts (for Undo last). Walks back over voided ones only. */
  lastCounted(): ObservationRecord | undefined {
    for (let i = this.records.length - 1; i >= 0; i--) {
      const r = this.records[i] as ObservationRecord;
      if (r.voids === undefined && !this.voidOf.has(r.id)) return r;
    }
    return undefined;
  }

  /** Files a record into the log; returns what it was. Does not touch the statistics. */
  private ingest(r: ObservationRecord): 'entry' | 'void' | 'ignored' {
    if (this.byId.has(r.id)) return 'ignored';
    this.records.push(r);
    this.byId.set(r.id, r);
    if (r.voids !== undefined) {
      const target = this.byId.get(r.voids);
      if (!target || this.voidOf.has(r.voids)) return 'ignored';
      this.voidOf.set(r.voids, r);
      return 'void';
    }
    if (r.value === undefined) return 'ignored';
    this.pace.addEntryTime(Date.parse(r.at));
    return 'entry';
  }

  /** One counted entry through the core, chaining the smoothing as the core's batch `assess` does. O(1). */
  /** Adds one counted record to the running state. O(1). */
  private addPoint(summary: RunningSummary, r: ObservationRecord, values: number[]): void {
    const p = pointOf(r);
    summary.add(p);
    if (!p.censored) values.push(p.value);
    this.points.push(p);
    if (p.cluster !== undefined || p.censored === true) this.designPoints = true;
  }

  /** The core's assessment of the entries so far (design-aware when the design applies). */
  private assessNow(
    summary: RunningSummary,
    values: number[],
    previous: Assessment | null,
    more = true,
  ): Assessment {
    const setup = this.study.setup;
    const { assessDesign, assessSummary, usesDesign } = loadedCore();
    return this.designPoints || usesDesign([], setup)
      ? assessDesign(this.points, setup)
      : assessSummary(summary, setup, values, { previous, more });
  }

  /** What the next entry's smoothing may look back to (the core's `assess` applies the same condition). */
  private remember(a: Assessment, summary: RunningSummary): void {
    const setup = this.study.setup;
    if (setup.target !== undefined && summary.n >= setup.min && summary.censored === 0) {
      this.previous = a.verdict.status === 'keep going' ? a : null;
    }
  }

  private step(summary: RunningSummary, r: ObservationRecord, values: number[]): Assessment {
    this.addPoint(summary, r, values);
    const a = this.assessNow(summary, values, this.previous);
    this.remember(a, summary);
    return a;
  }

  /** Adds a freshly saved record; returns the assessment before it (to detect a verdict change). */
  apply(r: ObservationRecord): Assessment {
    const before = this.assessment;
    const kind = this.ingest(r);
    if (kind === 'entry') {
      this.assessment = this.step(this.summary, r, this.values);
      this.pushSeries(this.assessment);
    } else if (kind === 'void') this.replay();
    return before;
  }

  private pushSeries(a: Assessment): void {
    if (a.n % this.stride !== 0 || a.estimate === null || a.lower === null || a.upper === null) return;
    this.series.push({ n: a.n, estimate: a.estimate, lower: a.lower, upper: a.upper });
    if (this.series.length > SERIES_MAX) {
      this.stride *= 2;
      this.series = this.series.filter((p) => p.n % this.stride === 0);
    }
  }

  /**
   * Rebuilds the running state from the counted entries (on load, and after a void). Adding an entry is
   * O(1); the core is asked for an assessment only at the chart's points (≤ SERIES_MAX) and at the last two
   * entries (the smoothed "more" looks one entry back), so opening a study of 5,000 entries costs a few
   * hundred assessments, not 5,000.
   */
  private replay(): void {
    this.summary = new (loadedCore().RunningSummary)();
    this.values = [];
    this.points = [];
    this.designPoints = false;
    this.previous = null;
    this.series = [];
    this.stride = 1;
    const counted = this.records.filter(
      (r) => r.voids === undefined && r.value !== undefined && !this.voidOf.has(r.id),
    );
    while (counted.length / this.stride > SERIES_MAX) this.stride *= 2;
    const last = counted.length - 1;
    let a: Assessment | null = null;
    counted.forEach((r, i) => {
      this.addPoint(this.summary, r, this.values);
      const n = this.points.length;
      if (i >= last - 1) {
        a = this.assessNow(this.summary, this.values, i === last ? this.previous : null);
        this.remember(a, this.summary);
        this.pushSeries(a);
      } else if (n % this.stride === 0) {
        // a chart point needs the interval only, not the costly projection
        this.pushSeries(this.assessNow(this.summary, this.values, null, false));
      }
    });
    this.assessment = a ?? this.assessNow(this.summary, this.values, null);
  }
}
