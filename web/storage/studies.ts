/** Studies: created once; only `lockedAt` / `archivedAt` are ever added later. Nothing is deleted. */
import type { StudySetup } from '../core.ts';
import { getDb, inTx, StorageError, withWrite } from './db.ts';
import type { StoredStudy } from './schema.ts';
import { isoWithOffset } from './time.ts';

export interface NewStudy {
  name: string;
  setup: StudySetup;
  notes?: string;
  supersedes?: string;
  demo?: boolean;
}

export function createStudy(input: NewStudy, device: string): Promise<StoredStudy> {
  return withWrite(async (db) => {
    const tx = db.transaction('studies', 'readwrite', { durability: 'strict' });
    return inTx(tx, async () => {
      const now = isoWithOffset();
      let version = 1;
      if (input.supersedes) {
        const old = await tx.store.get(input.supersedes);
        if (!old) throw new StorageError('Not saved: the study this one replaces is missing.', 'NotFound');
        version = old.version + 1;
      }
      const study: StoredStudy = {
        id: crypto.randomUUID(),
        name: input.name,
        createdAt: now,
        setup: structuredClone(input.setup),
        version,
        cautionsAcceptedAt: now,
        device,
      };
      if (input.notes) study.notes = input.notes;
      if (input.supersedes) study.supersedes = input.supersedes;
      if (input.demo) study.demo = true;
      await tx.store.add(study);
      return study;
    });
  });
}

export async function getStudy(id: string): Promise<StoredStudy | undefined> {
  return (await getDb()).get('studies', id);
}

export async function listStudies(): Promise<StoredStudy[]> {
  return (await getDb()).getAllFromIndex('studies', 'byCreatedAt');
}

/** Archive (or bring back): the study leaves the main list; its data stay. */
export function setArchived(id: string, archived: boolean): Promise<StoredStudy> {
  return withWrite(async (db) => {
    const tx = db.transaction('studies', 'readwrite', { durability: 'strict' });
    return inTx(tx, async () => {
      const s = await tx.store.get(id);
      if (!s) throw new StorageError('This study is not on this phone.', 'NotFound');
      const next: StoredStudy = { ...s };
      if (archived) next.archivedAt = isoWithOffset();
      else delete next.archivedAt;
      await tx.store.put(next);
      return next;
    });
  });
}
