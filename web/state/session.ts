/**
 * One open study in memory: its event log (entries and voids, in seq order) and the core's running
 * assessment of the entries that still count. The statistics — the assessment, the chart series, the
 * smoothing of "how many more" — all come from the core's RunningAssessment, the same one the report file,
 * `sure-enough assess` and `replay` use; this class only files records and tells the core which entry was
 * added or withdrawn. Adding an entry is O(1) for the data kinds (the pace median O(log n)); a void rebuilds
 * the running assessment from the counted entries. A session is only constructed after `loadCore()`
 * resolved (see web/core-loader.ts).
 *
 * A session opened from a running snapshot (`fromSnapshot`, web/storage/snapshots.ts) holds the last
 * records only (`complete` is false): the field screen needs the figures, the pace and "undo last", not the
 * whole log. Its figures are the core's restored running assessment — exactly those of a rebuild.
 */
import type { Assessment, ObservationRecord, Point, RunningAssessment, SeriesPoint } from '../core.ts';
import { loadedCore } from '../core-loader.ts';
import type { StoredStudy } from '../storage/schema.ts';
import { SESSION_SNAPSHOT_VERSION, type StoredSnapshot } from '../storage/snapshots.ts';
import { Pace } from './pace.ts';

/** How many of the last records a snapshot keeps (undo after undo walks back through them). */
export const TAIL = 40;

export type { SeriesPoint } from '../core.ts';

export function pointOf(rec: ObservationRecord): Point {
  const p: Point = { value: rec.value as number };
  if (rec.censored) p.censored = true;
  if (rec.stratum !== undefined) p.stratum = rec.stratum;
  if (rec.cluster !== undefined) p.cluster = rec.cluster;
  return p;
}

export class StudySession {
  /** The log in seq order — the whole log, or its last records when `complete` is false. */
  readonly records: ObservationRecord[] = [];
  /** entry id → the void record that withdrew it (within `records`). */
  readonly voidOf = new Map<string, ObservationRecord>();
  private readonly byId = new Map<string, ObservationRecord>();
  private running: RunningAssessment;
  readonly pace: Pace;
  /** Records (entries and voids) in the whole log. */
  logCount = 0;
  /** True once the study is locked (it has an entry): a save then needs no write to the study. */
  locked: boolean;

  constructor(
    readonly study: StoredStudy,
    records: readonly ObservationRecord[] = [],
    /** From a snapshot: the restored figures and pace, the log's count; `records` is then the tail. */
    restored?: { running: RunningAssessment; pace: Pace; count: number },
  ) {
    this.locked = study.lockedAt !== undefined;
    this.pace = restored?.pace ?? new Pace();
    for (const r of records) this.ingest(r, restored === undefined);
    if (restored) {
      this.running = restored.running;
      this.logCount = restored.count;
      this.complete = false;
      return;
    }
    const counted = this.records.filter(
      (r) => r.voids === undefined && r.value !== undefined && !this.voidOf.has(r.id),
    );
    this.running = new (loadedCore().RunningAssessment)(
      study.setup,
      counted.map(pointOf),
      counted.map((r) => r.id),
    );
  }

  /** False when opened from a snapshot: `records` then holds the last records of the log only. */
  readonly complete: boolean = true;

  /** A session from a stored snapshot already checked against the log; null when it cannot be restored. */
  static fromSnapshot(study: StoredStudy, snap: StoredSnapshot): StudySession | null {
    const running = loadedCore().restoreRunning(study.setup, snap.running);
    const pace = Pace.restore(snap.pace);
    if (running === null || pace === null) return null;
    return new StudySession(study, snap.tail, { running, pace, count: snap.count });
  }

  /** The snapshot of this session, for web/storage/snapshots.ts. */
  snapshot(): StoredSnapshot {
    return {
      studyId: this.study.id,
      version: SESSION_SNAPSHOT_VERSION,
      count: this.logCount,
      lastId: this.records.at(-1)?.id ?? null,
      running: loadedCore().snapshotRunning(this.running),
      pace: this.pace.state(),
      tail: this.records.slice(-TAIL),
    };
  }

  /** True when a session opened from a snapshot has undone every entry it holds: read the whole log. */
  get needsLog(): boolean {
    return !this.complete && this.n > 0 && this.lastCounted() === undefined;
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

  /** The counted results so far (non-detects left out), in entry order — the whole study, in either mode. */
  countedValues(): number[] {
    const out: number[] = [];
    for (const p of this.running.points()) if (p.censored !== true) out.push(p.value);
    return out;
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
  private ingest(r: ObservationRecord, timed = true): 'entry' | 'void' | 'unseen' | 'ignored' {
    if (this.byId.has(r.id)) return 'ignored';
    this.records.push(r);
    this.byId.set(r.id, r);
    this.logCount++;
    if (r.voids !== undefined) {
      const target = this.byId.get(r.voids);
      // the target may sit before the records a snapshot keeps: the running assessment knows it
      if (!target) return 'unseen';
      // a second void of one entry (pooled from two phones) is kept in the log; the entry is already out
      if (target.voids !== undefined || target.value === undefined || this.voidOf.has(r.voids))
        return 'ignored';
      this.voidOf.set(r.voids, r);
      return 'void';
    }
    if (r.value === undefined) return 'ignored';
    if (timed) this.pace.addEntryTime(Date.parse(r.at));
    return 'entry';
  }

  /** Adds a freshly saved record; returns the assessment before it (to detect a verdict change). */
  apply(r: ObservationRecord): Assessment {
    const before = this.running.assessment;
    const kind = this.ingest(r);
    if (kind === 'entry') {
      this.running.add(pointOf(r), r.id);
      this.locked = true;
    } else if (kind === 'void' && r.voids !== undefined) this.running.void(r.voids);
    else if (kind === 'unseen' && r.voids !== undefined && !this.complete) {
      try {
        this.running.void(r.voids);
      } catch {
        // not a counted entry (already voided before the kept records): the log keeps the void, as above
      }
    }
    return before;
  }
}
