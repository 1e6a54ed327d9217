/**
 * Installation facts: the device id (stored in the database, mirrored in localStorage so a cleared
 * database on the same phone keeps the same id), the first run, and the persistent-storage answer.
 */
import { getDb, withWrite } from './db.ts';
import type { MetaKey, PersistAnswer } from './schema.ts';
import { isoWithOffset } from './time.ts';

const LS_DEVICE = 'sure-enough.device';

export async function deviceId(): Promise<string> {
  const db = await getDb();
  const stored = await db.get('meta', 'device');
  if (typeof stored === 'string' && stored) return stored;
  let id: string | null = null;
  try {
    id = localStorage.getItem(LS_DEVICE);
  } catch {
    /* storage disabled: fall through */
  }
  if (!id) id = crypto.randomUUID();
  await withWrite(async (d) => {
    const tx = d.transaction('meta', 'readwrite', { durability: 'strict' });
    await tx.store.put(id, 'device');
    await tx.done;
  });
  try {
    localStorage.setItem(LS_DEVICE, id);
  } catch {
    /* best effort */
  }
  return id;
}

export interface PersistState {
  answer: PersistAnswer['answer'];
  firstRun: boolean;
}

/**
 * Asks for persistent storage at first run (an explicit init step, never at import) or when the user
 * asks again (`ask`); on other runs only reads the current state. Stores and returns the answer.
 */
export async function ensurePersistence(ask = false): Promise<PersistState> {
  const db = await getDb();
  const first = (await db.get('meta', 'firstRunAt')) === undefined;
  let answer: PersistAnswer['answer'] = 'unsupported';
  const storage = typeof navigator !== 'undefined' ? navigator.storage : undefined;
  if (storage?.persist) {
    try {
      const already = storage.persisted ? await storage.persisted() : false;
      answer = already || ((first || ask) && (await storage.persist())) ? 'granted' : 'refused';
    } catch {
      answer = 'refused';
    }
  }
  // nothing is written on an ordinary start: only at first run or when the answer changed
  const stored = (await db.get('meta', 'persist')) as PersistAnswer | undefined;
  if (first || stored?.answer !== answer)
    await withWrite(async (d) => {
      const tx = d.transaction('meta', 'readwrite', { durability: 'strict' });
      if (first) await tx.store.put(isoWithOffset(), 'firstRunAt');
      await tx.store.put({ at: isoWithOffset(), answer }, 'persist');
      await tx.done;
    });
  return { answer, firstRun: first };
}

/**
 * The key this phone shares a study with the crew server under (32 random bytes, base64url): made once
 * and kept before the first ask, so that asking again after a lost answer is recognised as the same share
 * (src/sync/protocol.ts, ShareRequest.shareKey).
 */
export async function shareKeyFor(studyId: string): Promise<string> {
  const db = await getDb();
  const name: MetaKey = `shareKey:${studyId}`;
  const stored = await db.get('meta', name);
  if (typeof stored === 'string' && stored) return stored;
  const bytes = crypto.getRandomValues(new Uint8Array(32));
  const key = btoa(String.fromCharCode(...bytes))
    .replace(/\+/g, '-')
    .replace(/\//g, '_')
    .replace(/=+$/, '');
  await withWrite(async (d) => {
    const tx = d.transaction('meta', 'readwrite', { durability: 'strict' });
    await tx.store.put(key, name);
    await tx.done;
  });
  return key;
}
