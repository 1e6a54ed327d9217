/**
 * The hand-over log: each export appends what it contained (up to which seq). "N entries not yet
 * exported" = the study's last seq minus the highest exported seq. For web/handover/* to call.
 */
import { getDb, withWrite } from './db.ts';
import type { ExportRecord } from './schema.ts';
import { isoWithOffset } from './time.ts';

export function recordExport(studyId: string, uptoSeq: number, format: string): Promise<ExportRecord> {
  return withWrite(async (db) => {
    const rec: ExportRecord = { id: crypto.randomUUID(), studyId, at: isoWithOffset(), uptoSeq, format };
    const tx = db.transaction('exports', 'readwrite', { durability: 'strict' });
    await tx.store.add(rec);
    await tx.done;
    return rec;
  });
}

/** Highest seq covered by any export of this study (0 when never exported). */
export async function exportedUpTo(studyId: string): Promise<number> {
  const all = await (await getDb()).getAllFromIndex('exports', 'byStudy', studyId);
  return all.reduce((m, r) => Math.max(m, r.uptoSeq), 0);
}
