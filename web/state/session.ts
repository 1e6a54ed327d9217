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
 * whole log. Its figures are the core's restored running assessment — exactly those of a rebuild. It can be
 * opened before the core has loaded (`fromSnapshot` without it only checks what the first frame draws);
 * `verify()`, once the core is there, runs the core's own check of the snapshot, and a snapshot that fails
 * it is rebuilt from the log (web/state/use-study.ts) before any figure is recomputed or saved over it.
 */
import type {
  Assessment,
  ObservationRecord,
  Point,
  RunningAssessment,
  RunningSnapshot,
  SeriesPoint,
} from '../core.ts';
import { coreIfLoaded, loadedCore } from '../core-loader.ts';
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
  private restored: RunningAssessment | null = null;
  /** A snapshot's running figures not restored yet: shown as stored until the first change needs them. */
  private stored: RunningSnapshot | null = null;
  readonly pace: Pace;
  /** Records (entries and voids) in the whole log. */
  logCount = 0;
  /** True once the study is locked (it has an entry): a save then needs no write to the study. */
  locked: boolean;

  constructor(
    readonly study: StoredStudy,
    records: readonly ObservationRecord[] = [],
    /** From a snapshot (already checked): its running figures, the pace, the log's count; `records` is the tail. */
    from?: { running: RunningSnapshot; pace: Pace; count: number },
  ) {
    this.locked = study.lockedAt !== undefined;
    this.pace = from?.pace ?? new Pace();
    for (const r of records) this.ingest(r, from === undefined);
    if (from) {
      this.stored = from.running;
      this.logCount = from.count;
      this.complete = false;
      return;
    }
    const counted = this.records.filter(
      (r) => r.voids === undefined && r.value !== undefined && !this.voidOf.has(r.id),
    );
    this.restored = new (loadedCore().RunningAssessment)(
      study.setup,
      counted.map(pointOf),
      counted.map((r) => r.id),
    );
  }

  /** The core's running assessment; a snapshot's is restored on first need (O(n) O(1)-adds, no pipeline). */
  private get running(): RunningAssessment {
    if (this.restored === null) {
      const r = loadedCore().restoreRunning(this.study.setup, this.stored);
      // fromSnapshot checked the snapshot with the same rules (snapshotFits), so this cannot happen
      if (r === null) throw new Error('The stored snapshot of this study could not be restored.');
      this.restored = r;
      this.stored = null;
    }
    return this.restored;
  }

  /** Restores a snapshot's running assessment now (called after the first frame, off the tap path). */
  settle(): void {
    void this.running;
  }

  /** False when opened from a snapshot: `records` then holds the last records of the log only. */
  readonly complete: boolean = true;

  /**
   * A session from a stored snapshot already matched against the log (count and last id); null when it
   * cannot be restored. With `checkNow` (by default when the core has loaded) the snapshot is checked in
   * full (`verify`); else only what the first frame reads is, and `verify()` must pass once the core is there.
   */
  static fromSnapshot(
    study: StoredStudy,
    snap: StoredSnapshot,
    checkNow = coreIfLoaded() !== null,
  ): StudySession | null {
    const pace = Pace.restore(snap.pace);
    if (pace === null || !drawable(study.setup, snap.running)) return null;
    const s = new StudySession(study, snap.tail, { running: snap.running, pace, count: snap.count });
    return !checkNow || s.verify() ? s : null;
  }

  /**
   * The core's check of a snapshot session (the core must be loaded): true when its figures are sound —
   * restored now, off the tap path — or it was not opened from a snapshot; false when it must be rebuilt
   * from the log.
   */
  verify(): boolean {
    if (this.restored !== null) return true;
    if (!loadedCore().snapshotFits(this.study.setup, this.stored)) return false;
    this.settle();
    return true;
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
    if (this.stored?.current) return this.stored.current;
    return this.running.assessment;
  }

  /** The running chart (the core's series). */
  get series(): SeriesPoint[] {
    const st = this.stored;
    if (st === null) return this.running.series;
    // the same rule as RunningAssessment.series: the sampled points, ending at the latest entry
    return st.latest === null || st.sampled.at(-1)?.n === st.latest.n
      ? st.sampled
      : [...st.sampled, st.latest];
  }

  /** Counted entries (not voided). */
  get n(): number {
    return this.stored?.values.length ?? this.running.n;
  }

  get lastSeq(): number {
    return this.records.at(-1)?.seq ?? 0;
  }

  /** The counted results so far (non-detects left out), in entry order — the whole study, in either mode. */
  countedValues(): number[] {
    const st = this.stored;
    if (st !== null) {
      // a snapshot not restored yet (the core may still be loading): its values, less the non-detects
      const censored = new Set(st.marks.filter((m) => m[1]).map((m) => m[0]));
      return st.values.filter((_, i) => !censored.has(i));
    }
    const out: number[] = [];
    for (const p of this.running.points()) if (p.censored !== true) out.push(p.value);
    return out;
  }

  private sorted: number[] | null = null;
  /**
   * The counted results in ascending order (for order-free figures such as the pad's outlier question):
   * sorted once, then each new entry is inserted in place (O(n) move, no sort on the tap path); a void
   * sorts again on next use.
   */
  sortedValues(): readonly number[] {
    this.sorted ??= this.countedValues().sort((a, b) => a - b);
    return this.sorted;
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
      if (this.sorted !== null && r.censored !== true) insertSorted(this.sorted, r.value as number);
    } else if (kind === 'void' && r.voids !== undefined) {
      this.running.void(r.voids);
      this.sorted = null;
    } else if (kind === 'unseen' && r.voids !== undefined && !this.complete) {
      try {
        this.running.void(r.voids);
        this.sorted = null;
      } catch {
        // not a counted entry (already voided before the kept records): the log keeps the void, as above
      }
    }
    return before;
  }
}

/**
 * What the field screen's first frame reads from a snapshot's running figures, before the core can check
 * them (the core's snapshotFits, run by `verify`, checks everything): the setup they were computed for,
 * the entries' values and marks, the current assessment's count and kind, the chart's points.
 */
function drawable(setup: StoredStudy['setup'], r: unknown): r is RunningSnapshot {
  if (typeof r !== 'object' || r === null) return false;
  const s = r as Partial<RunningSnapshot>;
  const cur = s.current as Partial<Assessment> | null | undefined;
  return (
    s.setup === JSON.stringify(setup) &&
    Array.isArray(s.values) &&
    Array.isArray(s.marks) &&
    s.marks.every((m) => Array.isArray(m)) &&
    Array.isArray(s.sampled) &&
    (s.latest === null || typeof s.latest === 'object') &&
    (cur === null ||
      (typeof cur === 'object' &&
        cur !== undefined &&
        cur.n === s.values.length &&
        cur.kind === setup.kind &&
        typeof cur.verdict === 'object'))
  );
}

function insertSorted(a: number[], x: number): void {
  let lo = 0;
  let hi = a.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((a[mid] as number) <= x) lo = mid + 1;
    else hi = mid;
  }
  a.splice(lo, 0, x);
}
