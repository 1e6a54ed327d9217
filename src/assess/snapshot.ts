/**
 * A running assessment as plain data and back, so that an app can open a study from a stored snapshot
 * instead of reassessing its whole log: the counted entries (values, the few marks some entries carry, and
 * their keys) and what the figures carry forward (the current assessment, the smoothing memory of "how many
 * more", the chart's sampled points). Restoring counts the entries again with the O(1) running-sum update
 * only — no pipeline run — so the running sums are exactly those of a rebuild, and the assessment, the next
 * entry's result and a later void or correction are exactly those of an assessment rebuilt from the log.
 *
 * The snapshot is a cache, never the record: `restoreRunning` refuses (returns null) anything that is not a
 * well-formed snapshot of this version for this very setup, and the caller then rebuilds from the log. It
 * cannot tell whether the entries are the log's: the caller checks that (the app compares the log's record
 * count and last id, web/storage/snapshots.ts).
 *
 * Every design restores the same way (strata, primary units and non-detects are marks on the entries).
 * Storage must keep numbers exactly (IndexedDB's structured clone does; JSON would turn an infinite figure
 * into null, which the check below then refuses).
 */
import type { AnalysisSetup, Point } from '../model/types.ts';
import { RunningAssessment, type RunningCarried, SERIES_MAX, type SeriesPoint } from './running.ts';

/** Raised whenever the shape or the meaning of the snapshot changes; older snapshots are then rebuilt. */
export const RUNNING_SNAPSHOT_VERSION = 2;

/** An entry that carries more than its value: [index, censored, stratum, primary unit]. */
export type EntryMarks = [number, boolean, string | null, string | null];

/** What a running assessment carries (its keys, smoothing memory, assessment and chart), plus its entries. */
export interface RunningSnapshot extends RunningCarried {
  version: number;
  /** The setup the figures were computed for, as JSON (a changed setup makes the snapshot useless). */
  setup: string;
  /** The counted entries' values, in entry order. */
  values: number[];
  /** Only the entries with a mark (non-detect, stratum, primary unit), in entry order. */
  marks: EntryMarks[];
}

export function snapshotRunning(r: RunningAssessment): RunningSnapshot {
  const points = r.points();
  const values: number[] = new Array(points.length);
  const marks: EntryMarks[] = [];
  points.forEach((p, i) => {
    values[i] = p.value;
    if (p.censored === true || p.stratum !== undefined || p.cluster !== undefined)
      marks.push([i, p.censored === true, p.stratum ?? null, p.cluster ?? null]);
  });
  const c = r.carried();
  return {
    version: RUNNING_SNAPSHOT_VERSION,
    setup: JSON.stringify(r.setup),
    values,
    marks,
    keys: c.keys,
    memory: c.memory,
    current: c.current === null ? null : structuredCopy(c.current),
    stride: c.stride,
    sampled: c.sampled,
    latest: c.latest,
  };
}

/**
 * True when `snap` is a sound snapshot for `setup` — the checks `restoreRunning` makes, without counting the
 * entries again, so that an app can show the stored figures first and restore the assessment later.
 */
export function snapshotFits(setup: AnalysisSetup, snap: unknown): snap is RunningSnapshot {
  if (!isSnapshot(snap) || snap.setup !== JSON.stringify(setup) || pointsOf(snap) === null) return false;
  return snap.current === null || (snap.current.n === snap.values.length && snap.current.kind === setup.kind);
}

/** The running assessment a snapshot describes, or null when it is not a sound snapshot for `setup`. */
export function restoreRunning(setup: AnalysisSetup, snap: unknown): RunningAssessment | null {
  if (!snapshotFits(setup, snap)) return null;
  const points = pointsOf(snap) as Point[];
  const copy = structuredCopy({
    keys: snap.keys,
    memory: snap.memory,
    current: snap.current,
    sampled: snap.sampled,
    latest: snap.latest,
  });
  return RunningAssessment.resumed(setup, points, { ...copy, stride: snap.stride });
}

function pointsOf(snap: RunningSnapshot): Point[] | null {
  const n = snap.values.length;
  const points: Point[] = snap.values.map((value) => ({ value }));
  let previous = -1;
  for (const m of snap.marks) {
    if (!Array.isArray(m) || m.length !== 4) return null;
    const [i, censored, stratum, cluster] = m;
    if (!Number.isInteger(i) || i <= previous || i >= n || typeof censored !== 'boolean') return null;
    if (
      !(stratum === null || typeof stratum === 'string') ||
      !(cluster === null || typeof cluster === 'string')
    )
      return null;
    previous = i;
    const p = points[i] as Point;
    if (censored) p.censored = true;
    if (stratum !== null) p.stratum = stratum;
    if (cluster !== null) p.cluster = cluster;
  }
  return points;
}

const isFiniteNumber = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);
const isBound = (x: unknown): boolean => x === null || isFiniteNumber(x);

function isSeriesPoint(p: unknown, n: number): p is SeriesPoint {
  if (typeof p !== 'object' || p === null) return false;
  const s = p as Record<string, unknown>;
  return (
    Number.isInteger(s.n) &&
    (s.n as number) >= 1 &&
    (s.n as number) <= n &&
    isFiniteNumber(s.estimate) &&
    isBound(s.lower) &&
    isBound(s.upper)
  );
}

function isSnapshot(x: unknown): x is RunningSnapshot {
  if (typeof x !== 'object' || x === null) return false;
  const s = x as Record<string, unknown>;
  if (s.version !== RUNNING_SNAPSHOT_VERSION || typeof s.setup !== 'string') return false;
  if (!Array.isArray(s.values) || !s.values.every(isFiniteNumber) || !Array.isArray(s.marks)) return false;
  const n = s.values.length;
  if (!Array.isArray(s.keys) || s.keys.length !== n) return false;
  if (!s.keys.every((k) => k === null || typeof k === 'string')) return false;
  // the chart halves its points when full, so its stride is a power of two and it holds at most SERIES_MAX
  if (
    !Number.isInteger(s.stride) ||
    (s.stride as number) < 1 ||
    ((s.stride as number) & ((s.stride as number) - 1)) !== 0
  )
    return false;
  if (!Array.isArray(s.sampled) || s.sampled.length > SERIES_MAX) return false;
  let last = 0;
  for (const p of s.sampled) {
    if (!isSeriesPoint(p, n) || p.n <= last || p.n % (s.stride as number) !== 0) return false;
    last = p.n;
  }
  if (s.latest !== null && !isSeriesPoint(s.latest, n)) return false;
  if (s.memory !== null) {
    const m = s.memory as Record<string, unknown> | undefined;
    if (typeof m !== 'object' || !Number.isInteger(m.n) || typeof m.rawLikelyTotal !== 'number') return false;
  }
  if (s.current !== null) {
    const a = s.current as Record<string, unknown> | undefined;
    if (
      typeof a !== 'object' ||
      !Number.isInteger(a.n) ||
      typeof a.verdict !== 'object' ||
      a.verdict === null
    )
      return false;
    if (typeof a.details !== 'object' || a.details === null || !Array.isArray(a.warnings)) return false;
  }
  return true;
}

/**
 * A deep copy of plain data — objects, arrays, numbers (infinite ones kept), strings, booleans, null — so
 * that a restored assessment shares nothing with the stored snapshot. (src/ has no structuredClone.)
 */
function structuredCopy<T>(x: T): T {
  if (typeof x !== 'object' || x === null) return x;
  if (Array.isArray(x)) return x.map(structuredCopy) as T;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(x)) out[k] = structuredCopy(v);
  return out as T;
}
