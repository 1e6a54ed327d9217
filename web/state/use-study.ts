/**
 * Loads a study into a StudySession and exposes the writes. The pads stay disabled until `loaded` (a save
 * racing the first load would be overwritten by it). Every write resolves only after the transaction
 * committed; the session is updated only then.
 *
 * Start: the field screen opens from the study's running snapshot when it matches the log (same record
 * count, same last record: one count and a one-step cursor, not the log) and rebuilds from the log
 * otherwise; the other screens read the whole log, with the statistics core loaded in parallel. From a
 * snapshot the screen draws and enables Save before the core has loaded: the core follows the first frame,
 * checks the snapshot in full (`StudySession.verify`) and, if it fails, the study is rebuilt from the log —
 * before any figure is recomputed (a save made meanwhile is in the log, so the rebuild has it). Nothing is
 * written at start.
 *
 * Tap path (`add`): one `add()` with the seq the session knows; it resolves once committed ("Saved #k"),
 * and the statistics follow after the next frame (`applied`), so the crew sees the save acknowledged
 * before the figures are recomputed. If another tab took that seq meanwhile (ConstraintError from the
 * unique [studyId, seq] index), the log is read again and the entry saved once more after it — never
 * written over anything. The snapshot is written after saves, when the page is idle.
 */
import { useCallback, useLayoutEffect, useRef, useState } from 'preact/hooks';
import type { Assessment, ObservationRecord } from '../core.ts';
import { coreIfLoaded, loadCore } from '../core-loader.ts';
import { StorageError } from '../storage/db.ts';
import { exportedUpTo } from '../storage/exports.ts';
import {
  addEntry,
  correctEntry,
  listObservations,
  type NewEntry,
  voidEntry,
} from '../storage/observations.ts';
import { matchesLast, readStart, writeSnapshot } from '../storage/snapshots.ts';
import { getStudy } from '../storage/studies.ts';
import { device, deviceReady } from './app-state.ts';
import { StudySession } from './session.ts';

export interface StudyView {
  session: StudySession | null;
  loaded: boolean;
  missing: boolean;
  loadError: string | null;
  exported: number;
  /** Bumps on every change so components re-render. */
  version: number;
  /**
   * Saves one entry; resolves once it has committed, with the assessment before it. `applied` resolves
   * with the assessment after it once the statistics have been updated (after the next frame).
   */
  add(
    entry: NewEntry,
  ): Promise<{ record: ObservationRecord; before: Assessment; applied: Promise<Assessment> }>;
  undoLast(reason: string): Promise<{ record: ObservationRecord; before: Assessment }>;
  correct(
    targetId: string,
    reason: string,
    entry: NewEntry,
  ): Promise<{ record: ObservationRecord; before: Assessment }>;
  voidOne(targetId: string, reason: string): Promise<{ record: ObservationRecord; before: Assessment }>;
}

/** Where a screen opens a study from: the whole log, or the running snapshot when it matches the log. */
export type OpenFrom = 'log' | 'snapshot';

type Opened = { missing: true } | { missing: false; session: StudySession };

/**
 * The checks a snapshot session still owes after its first frame: the log's record count against the
 * snapshot's (true when equal). The core's own check (`StudySession.verify`) follows it.
 */
const countChecks = new WeakMap<StudySession, Promise<boolean>>();

/**
 * Reads a study into a session: from its snapshot when asked and sound, else from the whole log. With the
 * core loaded every check of the snapshot is made here; without it (a cold start: `firstFrame`) the session
 * is returned once the snapshot's last record matches the log's, and `checkOpened` makes the rest — the
 * log's count, the core's check — after the first frame.
 */
export async function openSession(
  id: string,
  from: OpenFrom,
  firstFrame = coreIfLoaded() === null,
): Promise<Opened> {
  // the strata panel reads every counted entry from the records: a stratified study opens from its log
  if (from === 'snapshot') {
    const start = await readStart(id);
    if (!start.study) return { missing: true };
    const snap = start.snapshot;
    if (!start.study.setup.strata?.length && snap && matchesLast(snap, start.last)) {
      const s = StudySession.fromSnapshot(start.study, snap, !firstFrame);
      if (s && firstFrame) {
        countChecks.set(
          s,
          start.count.then(
            (n) => n === snap.count,
            () => false,
          ),
        );
        return { missing: false, session: s };
      }
      if (s && (await start.count) === snap.count && (await checkOpened(s)))
        return { missing: false, session: s };
    }
  }
  const [study, records] = await Promise.all([getStudy(id), listObservations(id), loadCore()]);
  if (!study) return { missing: true };
  return { missing: false, session: new StudySession(study, records) };
}

/**
 * The checks of a session that `openSession` left for after the first frame: true when the snapshot it was
 * opened from matches the log's count and passes the core's check (or it was read from the log); false
 * when it must be rebuilt from the log. Loads the core.
 */
export async function checkOpened(s: StudySession): Promise<boolean> {
  const [countOk] = await Promise.all([countChecks.get(s) ?? true, loadCore()]);
  return countOk && s.verify();
}

/** The core's check of each session opened (one per session, shared by whoever waits for it). */
const checks = new WeakMap<StudySession, Promise<StudySession>>();

/** One pending snapshot write per study (switching studies must not cancel the other's). */
const snapshotTimers = new Map<string, ReturnType<typeof setTimeout>>();
/** Writes the session's snapshot once saves have paused (a cache: a failure only costs a rebuild). */
function scheduleSnapshot(s: StudySession, delay = SNAPSHOT_DELAY_MS): void {
  const id = s.study.id;
  clearTimeout(snapshotTimers.get(id));
  snapshotTimers.set(
    id,
    setTimeout(() => {
      snapshotTimers.delete(id);
      const write = () => void writeSnapshot(s.snapshot()).catch(() => undefined);
      const idle = (globalThis as { requestIdleCallback?: (fn: () => void) => void }).requestIdleCallback;
      if (idle) idle(write);
      else write();
    }, delay),
  );
}
/** When the screen closes, a pending snapshot is written at once (still after the frame, when idle). */
function flushSnapshot(s: StudySession | null): void {
  if (s !== null && snapshotTimers.has(s.study.id)) scheduleSnapshot(s, 0);
}
/** Saves closer together than this share one snapshot write. */
export const SNAPSHOT_DELAY_MS = 1000;

/** Runs `fn` after the next frame has been painted (or soon, where there are no frames). */
function afterFrame(fn: () => void): void {
  if (typeof requestAnimationFrame === 'function') requestAnimationFrame(() => setTimeout(fn, 0));
  else setTimeout(fn, 0);
}

export function useStudy(id: string, from: OpenFrom = 'log'): StudyView {
  const [session, setSession] = useState<StudySession | null>(null);
  const [loaded, setLoaded] = useState(false);
  const [missing, setMissing] = useState(false);
  const [loadError, setLoadError] = useState<string | null>(null);
  const [exported, setExported] = useState(0);
  const [version, setVersion] = useState(0);
  const ref = useRef<StudySession | null>(null);
  /** The last seq this tab committed: a second save may commit before the first one's statistics ran. */
  const committed = useRef(0);
  /**
   * The saved entries' statistics still waiting for the next frame. Undo, void and correct wait for them:
   * "undo last" read before the last save was applied would withdraw the entry before it.
   */
  const pending = useRef<Promise<unknown>>(Promise.resolve());

  // a layout effect, so that the storage reads start with the first render instead of after its paint
  useLayoutEffect(() => {
    let live = true;
    committed.current = 0;
    setLoaded(false);
    setSession(null);
    ref.current = null;
    (async () => {
      try {
        // the pads need the device id (filed with each entry): read in parallel with the study
        const [opened, upTo] = await Promise.all([openSession(id, from), exportedUpTo(id), deviceReady()]);
        if (!live) return;
        if (opened.missing) {
          setMissing(true);
          setLoaded(true);
          return;
        }
        ref.current = opened.session;
        setSession(opened.session);
        setExported(upTo);
        setLoaded(true);
        // after the first frame, off the tap path: load the core, check and restore a snapshot's running
        // assessment (rebuilt from the log if unsound), and sort the results once for the outlier question
        afterFrame(() => {
          void sound(opened.session).then(
            (s) => s.sortedValues(),
            () => undefined,
          );
        });
      } catch (err) {
        if (live)
          setLoadError(`Could not read this study from the phone's storage: ${(err as Error).message}`);
      }
    })();
    return () => {
      live = false;
      flushSnapshot(ref.current);
    };
  }, [id, from]);

  /** Reads the whole log again (another tab wrote, or "undo" walked past the records a snapshot keeps). */
  const reload = useCallback(async (): Promise<StudySession> => {
    const opened = await openSession(id, 'log');
    if (opened.missing) throw new Error('This study is no longer on this phone.');
    ref.current = opened.session;
    setSession(opened.session);
    return opened.session;
  }, [id]);

  /**
   * The session, once the core has loaded and checked it: a snapshot session whose figures fail the core's
   * check is replaced by one read from the whole log (one check per session; later calls return at once).
   */
  const sound = useCallback(
    (s: StudySession): Promise<StudySession> => {
      let p = checks.get(s);
      if (p === undefined) {
        p = checkOpened(s).then(async (ok) => {
          if (ok || ref.current !== s) return ref.current ?? s;
          const rebuilt = await reload();
          setVersion((v) => v + 1);
          return rebuilt;
        });
        checks.set(s, p);
      }
      return p;
    },
    [reload],
  );

  const apply = useCallback(
    async (records: ObservationRecord[]) => {
      let s = ref.current as StudySession;
      let before = s.assessment;
      const checked = await sound(s);
      if (checked !== s) {
        // rebuilt from the log, which already holds these records
        s = checked;
      } else if ((records[0]?.seq ?? 0) !== s.lastSeq + 1) {
        // Another tab of the app wrote to this study meanwhile (a gap in seq): read the log again so that
        // n, the verdict and "undo last" cover every entry on the phone, not only this tab's. Rare; O(n).
        s = await reload();
      } else {
        records.forEach((r, i) => {
          const b = s.apply(r);
          if (i === 0) before = b;
        });
        if (s.needsLog) s = await reload();
      }
      setVersion((v) => v + 1);
      scheduleSnapshot(s);
      return { record: records.at(-1) as ObservationRecord, before };
    },
    [reload, sound],
  );

  const need = () => {
    if (!ref.current) throw new Error('The study is still loading.');
    return ref.current;
  };

  const save = async (s: StudySession, entry: NewEntry) => {
    const seq = Math.max(s.lastSeq, committed.current) + 1;
    const rec = await addEntry(id, entry, device.get(), { seq, lock: !s.locked });
    committed.current = rec.seq;
    s.locked = true;
    return rec;
  };

  return {
    session,
    loaded,
    missing,
    loadError,
    exported,
    version,
    add: async (entry) => {
      let s = need();
      let record: ObservationRecord;
      try {
        record = await save(s, entry);
      } catch (err) {
        if (!(err instanceof StorageError) || err.code !== 'ConstraintError') throw err;
        // another tab saved an entry with this seq first: read the log and save after it (once)
        s = await reload();
        setVersion((v) => v + 1);
        record = await save(s, entry);
      }
      const before = s.assessment;
      const applied = new Promise<Assessment>((resolve, reject) =>
        afterFrame(() => {
          apply([record]).then(() => resolve((ref.current as StudySession).assessment), reject);
        }),
      );
      pending.current = Promise.all([pending.current, applied.catch(() => undefined)]);
      return { record, before, applied };
    },
    undoLast: async (reason) => {
      await pending.current;
      const last = need().lastCounted();
      if (!last) throw new Error('There is no entry to undo.');
      return apply([await voidEntry(id, last.id, reason, device.get())]);
    },
    voidOne: async (targetId, reason) => {
      await pending.current;
      need();
      return apply([await voidEntry(id, targetId, reason, device.get())]);
    },
    correct: async (targetId, reason, entry) => {
      await pending.current;
      need();
      return apply(await correctEntry(id, targetId, reason, entry, device.get()));
    },
  };
}
