/**
 * Writing an imported study bundle: the only place where a file's events enter this phone's database.
 *
 * One `durability: 'strict'` transaction over studies and observations, which reads what the phone holds
 * of the study, asks the caller's pooling rule what to add (`decide`: src/bundle/pool.ts, passed in by
 * web/handover/import.ts so that storage stays free of the core and the shell stays small), and writes
 * exactly that — or nothing. The rule runs inside the transaction, so no other tab can write to the study
 * between the read and the write; it must be synchronous (the checksum, the platform's asynchronous SHA-256,
 * is checked before this is called: awaiting anything but IndexedDB here would let the transaction commit
 * half-way).
 *
 * How the plan is written (the store is append-only, SCHEMA-v2.md):
 * - a study not on this phone is created from the file's record, with the file's events and seq exactly;
 * - for a study already here, the added events are appended after this phone's last seq, in the file's
 *   order; the phone's own study record is kept (existing records are never rewritten), and only its
 *   `lockedAt` is set if it had no entries yet;
 * - refused here, beyond the pooling rule: a study archived on this phone, and an event id that this phone
 *   already holds in another study.
 */
import type { ObservationRecord, StudyRecord } from '../core.ts';
import { inTx, withWrite } from './db.ts';
import { logWritten } from './log-events.ts';
import type { StoredStudy } from './schema.ts';
import { isoWithOffset } from './time.ts';

/** What the phone holds of the study: its record (none when new here) and its events in seq order. */
export interface HeldOnPhone {
  study: StoredStudy | undefined;
  events: ObservationRecord[];
}

/** The pooling rule's answer, as far as storage needs it (src/bundle/pool.ts PoolPlan fits). */
export type ImportDecision = { ok: true; add: ObservationRecord[] } | { ok: false; message: string };

export type ImportWritten<P> =
  | { ok: true; plan: P; created: boolean; studyName: string }
  | { ok: false; message: string };

class Refusal extends Error {}

function studyRange(studyId: string): IDBKeyRange {
  return IDBKeyRange.bound([studyId, 0], [studyId, Number.POSITIVE_INFINITY]);
}

/**
 * Writes what `decide` says the file `study` adds, in one transaction or not at all. Resolves after the
 * transaction committed (or was abandoned for a refusal, with nothing written).
 */
export async function writeImport<P extends ImportDecision>(
  study: StudyRecord,
  decide: (held: HeldOnPhone) => P,
): Promise<ImportWritten<P & { ok: true }>> {
  const written = await withWrite(async (db) => {
    const tx = db.transaction(['studies', 'observations'], 'readwrite', { durability: 'strict' });
    const studies = tx.objectStore('studies');
    const obs = tx.objectStore('observations');
    try {
      return await inTx(tx, async () => {
        const local = await studies.get(study.id);
        if (local?.archivedAt)
          throw new Refusal(`refused: study "${local.name}" is archived on this phone; bring it back first`);
        const events = await obs.index('byStudySeq').getAll(studyRange(study.id));
        const plan = decide({ study: local, events });
        if (!plan.ok) throw new Refusal(plan.message);
        for (const e of plan.add)
          if ((await obs.getKey(e.id)) !== undefined)
            throw new Refusal(
              `refused: event ${e.id} (seq ${e.seq} in this file) is on this phone in another study; one of the files was altered`,
            );
        if (!local) {
          const stored: StoredStudy = structuredClone(study);
          if (plan.add.length > 0) stored.lockedAt = isoWithOffset();
          await studies.add(stored);
        } else if (plan.add.length > 0 && !local.lockedAt)
          await studies.put({ ...local, lockedAt: isoWithOffset() });
        // A study new here keeps the file's seq (its log exactly); otherwise append after the last seq.
        const append = local !== undefined || events.length > 0;
        let seq = events.at(-1)?.seq ?? 0;
        for (const e of plan.add) {
          seq = append ? seq + 1 : e.seq;
          await obs.add({ ...structuredClone(e), seq });
        }
        return {
          ok: true as const,
          plan: plan as P & { ok: true },
          created: !local,
          studyName: local?.name ?? study.name,
        };
      });
    } catch (err) {
      if (err instanceof Refusal) return { ok: false as const, message: err.message };
      throw err;
    }
  });
  if (written.ok && written.plan.add.length > 0) logWritten(study.id);
  return written;
}
