/**
 * The sync client's light entry (in the app shell): when to sync. The work itself — storage reads, the
 * network, the core — is in engine.ts, loaded on first use, so the shell stays small and nothing of it
 * runs on the tap path.
 *
 * A linked study syncs when its field screen opens (once the phone is idle) and every minute while it is
 * open (`watchStudy`),
 * SAVE_DEBOUNCE_MS after the last save (the storage's log-write signal, web/storage/log-events.ts),
 * and for every linked study when the phone comes back online and once at start (`startSync`).
 */
import { onLogWrite } from '../storage/log-events.ts';

export const SAVE_DEBOUNCE_MS = 3_000;
export const TICK_MS = 60_000;

type Reason = 'open' | 'save' | 'tick' | 'online' | 'manual';
const engine = () => import('./engine.ts');

/** Asks for a sync of one study; errors end in the status, never in the caller. */
export function syncSoon(studyId: string, reason: Reason): Promise<void> {
  return engine()
    .then((m) => m.syncStudy(studyId, reason))
    .catch(() => undefined);
}

async function syncAll(reason: Reason): Promise<void> {
  const { listLinks } = await import('../storage/crew.ts');
  const links = await listLinks();
  // a phone with no shared study never loads the sync engine
  if (links.length === 0) return;
  const m = await engine();
  for (const link of links) void m.syncStudy(link.studyId, reason).catch(() => undefined);
}

const debounce = new Map<string, ReturnType<typeof setTimeout>>();

/** Started once by web/main.tsx after the storage opened. */
export function startSync(): () => void {
  const off = onLogWrite((studyId) => {
    // only a timer here: the save's caller is still on its way to "Saved"
    clearTimeout(debounce.get(studyId));
    debounce.set(
      studyId,
      setTimeout(() => {
        debounce.delete(studyId);
        void syncSoon(studyId, 'save');
      }, SAVE_DEBOUNCE_MS),
    );
  });
  const online = () => void syncAll('online').catch(() => undefined);
  window.addEventListener('online', online);
  // the start's sync waits until the first screen is drawn and the phone is idle: it must not compete
  // with the cold start for the storage or the main thread
  const idle = (globalThis as { requestIdleCallback?: (fn: () => void, o?: { timeout: number }) => void })
    .requestIdleCallback;
  const first = () => void syncAll('open').catch(() => undefined);
  if (idle) idle(first, { timeout: 5_000 });
  else setTimeout(first, 1_000);
  return () => {
    off();
    window.removeEventListener('online', online);
  };
}

/** While a study's field screen is open: sync now and every minute; returns the stop. */
export function watchStudy(studyId: string): () => void {
  // the open's sync waits until the phone is idle: the field screen's start comes first
  let live = true;
  const idle = (globalThis as { requestIdleCallback?: (fn: () => void, o?: { timeout: number }) => void })
    .requestIdleCallback;
  const first = () => live && void syncSoon(studyId, 'open');
  if (idle) idle(first, { timeout: 2_000 });
  else setTimeout(first, 200);
  const every = setInterval(() => void syncSoon(studyId, 'tick'), TICK_MS);
  return () => {
    live = false;
    clearInterval(every);
  };
}
