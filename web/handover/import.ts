/**
 * Importing a study bundle into this phone: validate first (src/bundle/validate.ts), then write everything
 * in ONE IndexedDB transaction — or nothing. Rules (as `sure-enough merge`, src/bundle/merge.ts):
 * - a study not on this phone is created with the bundle's log exactly (same ids, same seq);
 * - a study already here must have an identical setup; its entries and voids are added by UUID (union):
 *   events already here are skipped (importing the same bundle twice changes nothing); an id already here
 *   with different content refuses the whole import;
 * - new events are appended after this phone's last seq, in the bundle's order. Existing records are
 *   never rewritten (the store is append-only), so the seq order can differ from `merge`'s time order;
 *   the set of events — and the order-free figures — are the same;
 * - two voids of one entry cannot be stored (the `byVoids` index is unique): such an import is refused.
 * Likely duplicates (same label from two devices) and each collector's share are returned for display.
 */

import { getDb, withWrite } from '../storage/db.ts';
import type { StoredStudy } from '../storage/schema.ts';
import { isoWithOffset } from '../storage/time.ts';
import {
  type Bundle,
  type CollectorShare,
  canonicalJson,
  cleanEvent,
  collectorShares,
  type LikelyDuplicate,
  likelyDuplicates,
  makeBundle,
  type ObservationRecord,
  parseBundle,
} from './core-handover.ts';

export type ImportOutcome =
  | {
      ok: true;
      studyId: string;
      studyName: string;
      created: boolean;
      added: number;
      alreadyPresent: number;
      duplicates: LikelyDuplicate[];
      shares: CollectorShare[];
    }
  | { ok: false; problems: string[] };

class Refusal extends Error {}

/** The local study as a bundle would carry it (storage-only members left out). */
const bundleOfLocal = (s: StoredStudy) => makeBundle(s, []);

const sameContent = (a: ObservationRecord, b: ObservationRecord) =>
  canonicalJson({ ...cleanEvent(a), seq: 0 }) === canonicalJson({ ...cleanEvent(b), seq: 0 });

function studyRange(studyId: string): IDBKeyRange {
  return IDBKeyRange.bound([studyId, 0], [studyId, Number.POSITIVE_INFINITY]);
}

async function write(bundle: Bundle): Promise<ImportOutcome> {
  const { study, events } = bundle;
  return withWrite(async (db) => {
    const tx = db.transaction(['studies', 'observations'], 'readwrite', { durability: 'strict' });
    const studies = tx.objectStore('studies');
    const obs = tx.objectStore('observations');
    try {
      const local = await studies.get(study.id);
      if (local) {
        if (local.archivedAt)
          throw new Refusal(`study "${local.name}" is archived on this phone; bring it back first`);
        if (canonicalJson(bundleOfLocal(local).study.setup) !== canonicalJson(study.setup))
          throw new Refusal(
            `study "${local.name}" is on this phone with a different setup; entries taken under different setups cannot be pooled`,
          );
      }
      const last = await obs.index('byStudySeq').openCursor(studyRange(study.id), 'prev');
      let seq = last?.value.seq ?? 0;
      let added = 0;
      let alreadyPresent = 0;
      const newVoidTargets = new Set<string>();
      const toAdd: ObservationRecord[] = [];
      for (const e of events) {
        const have = await obs.get(e.id);
        if (have) {
          if (have.studyId !== study.id || !sameContent(have, e))
            throw new Refusal(`event ${e.id} (seq ${e.seq} in the file) differs from the one on this phone`);
          alreadyPresent++;
          continue;
        }
        if (e.voids !== undefined) {
          const already = await obs.index('byVoids').getKey(e.voids);
          if (already !== undefined || newVoidTargets.has(e.voids))
            throw new Refusal(
              `the entry ${e.voids} is voided twice (on two phones); this version keeps one void per entry, so the file cannot be imported`,
            );
          newVoidTargets.add(e.voids);
        }
        toAdd.push(e);
      }
      if (!local) {
        const stored: StoredStudy = { ...structuredClone(study) };
        if (events.length > 0) stored.lockedAt = isoWithOffset();
        await studies.add(stored);
      } else if (toAdd.length > 0 && !local.lockedAt)
        await studies.put({ ...local, lockedAt: isoWithOffset() });
      for (const e of toAdd) {
        seq = local ? seq + 1 : e.seq;
        await obs.add({ ...structuredClone(e), seq });
        added++;
      }
      await tx.done;
      const all = await (await getDb()).getAllFromIndex('observations', 'byStudySeq', studyRange(study.id));
      return {
        ok: true,
        studyId: study.id,
        studyName: local?.name ?? study.name,
        created: !local,
        added,
        alreadyPresent,
        duplicates: likelyDuplicates(all),
        shares: collectorShares(all),
      };
    } catch (err) {
      try {
        tx.abort();
      } catch {
        /* already finished */
      }
      await tx.done.catch(() => undefined);
      if (err instanceof Refusal) return { ok: false, problems: [`refused: ${err.message}`] };
      throw err;
    }
  });
}

/** Validates the text and imports it; a malformed file leaves the database exactly as it was. */
export async function importBundleText(text: string): Promise<ImportOutcome> {
  const parsed = parseBundle(text);
  if (!parsed.ok) return { ok: false, problems: parsed.problems };
  return write(parsed.bundle);
}
