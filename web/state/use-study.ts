/**
 * Loads a study and its log from storage into a StudySession and exposes the writes. The pads stay
 * disabled until `loaded` (a save racing the first load would be overwritten by it). Every write
 * resolves only after the transaction committed; the session is updated only then.
 */
import { useCallback, useEffect, useRef, useState } from 'preact/hooks';
import type { Assessment, ObservationRecord } from '../core.ts';
import { loadCore } from '../core-loader.ts';
import { exportedUpTo } from '../storage/exports.ts';
import {
  addEntry,
  correctEntry,
  listObservations,
  type NewEntry,
  voidEntry,
} from '../storage/observations.ts';
import { getStudy } from '../storage/studies.ts';
import { device } from './app-state.ts';
import { StudySession } from './session.ts';

export interface StudyView {
  session: StudySession | null;
  loaded: boolean;
  missing: boolean;
  loadError: string | null;
  exported: number;
  /** Bumps on every change so components re-render. */
  version: number;
  add(entry: NewEntry): Promise<{ record: ObservationRecord; before: Assessment }>;
  undoLast(reason: string): Promise<{ record: ObservationRecord; before: Assessment }>;
  correct(
    targetId: string,
    reason: string,
    entry: NewEntry,
  ): Promise<{ record: ObservationRecord; before: Assessment }>;
  voidOne(targetId: string, reason: string): Promise<{ record: ObservationRecord; before: Assessment }>;
}

export function useStudy(id: string): StudyView {
  const [session, setSession] = useState<StudySession | null>(null);
  const [loaded, setLoaded] = useState(false);
  const [missing, setMissing] = useState(false);
  const [loadError, setLoadError] = useState<string | null>(null);
  const [exported, setExported] = useState(0);
  const [version, setVersion] = useState(0);
  const ref = useRef<StudySession | null>(null);

  useEffect(() => {
    let live = true;
    setLoaded(false);
    setSession(null);
    ref.current = null;
    (async () => {
      try {
        const study = await getStudy(id);
        if (!live) return;
        if (!study) {
          setMissing(true);
          setLoaded(true);
          return;
        }
        const [records, upTo] = await Promise.all([listObservations(id), exportedUpTo(id)]);
        if (!live) return;
        await loadCore();
        if (!live) return;
        const s = new StudySession(study, records);
        ref.current = s;
        setSession(s);
        setExported(upTo);
        setLoaded(true);
      } catch (err) {
        if (live)
          setLoadError(`Could not read this study from the phone's storage: ${(err as Error).message}`);
      }
    })();
    return () => {
      live = false;
    };
  }, [id]);

  const apply = useCallback(
    async (records: ObservationRecord[]) => {
      let s = ref.current as StudySession;
      let before = s.assessment;
      if ((records[0]?.seq ?? 0) !== s.lastSeq + 1) {
        // Another tab of the app wrote to this study meanwhile (a gap in seq): read the log again so that
        // n, the verdict and "undo last" cover every entry on the phone, not only this tab's. Rare; O(n).
        s = new StudySession(s.study, await listObservations(id));
        ref.current = s;
        setSession(s);
      } else {
        records.forEach((r, i) => {
          const b = s.apply(r);
          if (i === 0) before = b;
        });
      }
      setVersion((v) => v + 1);
      return { record: records.at(-1) as ObservationRecord, before };
    },
    [id],
  );

  const need = () => {
    if (!ref.current) throw new Error('The study is still loading.');
    return ref.current;
  };

  return {
    session,
    loaded,
    missing,
    loadError,
    exported,
    version,
    add: async (entry) => {
      need();
      return apply([await addEntry(id, entry, device.get())]);
    },
    undoLast: async (reason) => {
      const last = need().lastCounted();
      if (!last) throw new Error('There is no entry to undo.');
      return apply([await voidEntry(id, last.id, reason, device.get())]);
    },
    voidOne: async (targetId, reason) => {
      need();
      return apply([await voidEntry(id, targetId, reason, device.get())]);
    },
    correct: async (targetId, reason, entry) => {
      need();
      return apply(await correctEntry(id, targetId, reason, entry, device.get()));
    },
  };
}
