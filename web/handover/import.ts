/**
 * Importing a study bundle into this phone. Three steps, in this order:
 * 1. validate the file (src/bundle/validate.ts) — including its checksum, the platform's asynchronous
 *    SHA-256, which is why it happens here, before any IndexedDB transaction is open;
 * 2. decide what it adds by the one pooling rule `sure-enough merge` also uses (src/bundle/pool.ts): the same
 *    refusals in the same words (another setup; an event id here with different content), union by id,
 *    voids kept (two phones' voids of one entry are both stored), likely duplicates flagged, shares;
 * 3. write it in one transaction or not at all (web/storage/import.ts, the only writer).
 * Where the phone differs from `merge` (documented in src/bundle/SCHEMA.md, "Pooling"): new events are
 * appended after this phone's last seq instead of re-sequencing the log by time, and the phone keeps its own
 * study record; the set of events and every figure reported are the same.
 */
import { writeImport } from '../storage/import.ts';
import { type Bundle, type PoolReport, parseBundle, poolBundle } from './core-handover.ts';

export type ImportOutcome =
  | ({ ok: true; studyId: string; studyName: string; created: boolean } & PoolReport)
  | { ok: false; problems: string[] };

async function write(bundle: Bundle): Promise<ImportOutcome> {
  const written = await writeImport(bundle.study, (held) => poolBundle(held, bundle));
  if (!written.ok) return { ok: false, problems: [written.message] };
  return {
    ok: true,
    studyId: bundle.study.id,
    studyName: written.studyName,
    created: written.created,
    ...written.plan.report,
  };
}

/** Validates the text and imports it; a malformed or refused file leaves the database exactly as it was. */
export async function importBundleText(text: string): Promise<ImportOutcome> {
  const parsed = await parseBundle(text);
  if (!parsed.ok) return { ok: false, problems: parsed.problems };
  return write(parsed.bundle);
}
