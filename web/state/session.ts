/**
 * One open study in memory: its event log (entries and voids, in seq order) and the core's running
 * assessment of the entries that still count. The statistics — the assessment, the chart series, the
 * smoothing of "how many more" — all come from the core's RunningAssessment, the same one the report file,
 * `sure-enough assess` and `replay` use; this class only files records and tells the core which entry was
 * added or withdrawn. Adding an entry is O(1) for the data kinds (the pace median O(log n)); a void rebuilds
 * the running assessment from the counted entries. A session is only constructed after `loadCore()`
 * resolved (see web/core-loader.ts).
 */
import type { Assessment, ObservationRecord, Point, RunningAssessment, SeriesPoint } from '../core.ts';
import { loadedCore } from '../core-loader.ts';
import type { StoredStudy } from '../storage/schema.ts';
import { Pace } from './pace.ts';

export type { SeriesPoint } from '../core.ts';

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
  private running: RunningAssessment;
  readonly pace = new Pace();

  constructor(
    readonly study: StoredStudy,
    records: readonly ObservationRecord[] = [],
  ) {
    for (const r of records) this.ingest(r);
    const counted = this.records.filter(
      (r) => r.voids === undefined && r.value !== undefined && !this.voidOf.has(r.id),
    );
    this.running = new (loadedCore().RunningAssessment)(
      study.setup,
      counted.map(pointOf),
      counted.map((r) => r.id),
    );
  }

  get assessment(): Assessment {
    return this.running.assessment;
  }

  /** The running chart (the core's series). */
  get series(): SeriesPoint[] {
    return this.running.series;
  }

  /** Counted entries (not voided). */
  get n(): number {
    return this.running.n;
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
      // a second void of one entry (pooled from two phones) is kept in the log; the entry is already out
      if (!target || target.voids !== undefined || target.value === undefined || this.voidOf.has(r.voids))
        return 'ignored';
      this.voidOf.set(r.voids, r);
      return 'void';
    }
    if (r.value === undefined) return 'ignored';
    this.pace.addEntryTime(Date.parse(r.at));
    return 'entry';
  }

  /** Adds a freshly saved record; returns the assessment before it (to detect a verdict change). */
  apply(r: ObservationRecord): Assessment {
    const before = this.running.assessment;
    const kind = this.ingest(r);
    if (kind === 'entry') this.running.add(pointOf(r), r.id);
    else if (kind === 'void' && r.voids !== undefined) this.running.void(r.voids);
    return before;
  }
}
