/**
 * The app's bundle import (web/handover/import.ts, importBundleText) under fuzzing, against
 * fake-indexeddb (an in-memory implementation of the W3C IndexedDB API): every malformed file and every
 * well-formed file the phone must refuse leaves the database byte-for-byte as it was, and says why.
 *
 * The phone holds one study (7 entries, one voided). Files tried:
 * - ≥ 1,000 malformed files: faults planted in this very study's own export, and in random bundles;
 * - well-formed files that must be refused — the same study with a changed setup, an entry already on the
 *   phone with different content — each also carrying new, valid entries placed before the conflict, so a
 *   write that were not all-or-nothing would show. (A second void of an entry already voided, from another
 *   phone, is accepted since schema version 2: test/web/pooling.test.ts.)
 * Evidence level: derived (the refusal rules are the import's documented ones).
 */
import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import fc from 'fast-check';
import { beforeAll, describe, expect, it } from 'vitest';
import { type Bundle, bundleChecksum, makeBundle } from '../../src/bundle/bundle.ts';
import type { ObservationRecord, StudySetup } from '../../src/model/records.ts';
import { importBundleText } from '../../web/handover/import.ts';
import { getDb, resetDbForTests } from '../../web/storage/db.ts';
import { addEntry, listObservations, voidEntry } from '../../web/storage/observations.ts';
import { createStudy, getStudy } from '../../web/storage/studies.ts';
import { expectClearProblems, faultArb, faultsIn, uuidArb } from './bundle-arbitraries.ts';

const setup: StudySetup = {
  kind: 'count',
  level: 0.95,
  sided: 'two',
  rule: 'standard',
  min: 5,
  target: { kind: 'precision', value: 0.25 },
  plotArea: 1,
  plotAreaUnit: 'm2',
};

let phoneBundle: Bundle;
let before: string;

async function dump(): Promise<string> {
  const db = await getDb();
  return JSON.stringify([
    await db.getAll('studies'),
    await db.getAll('observations'),
    await db.getAll('exports'),
    await db.getAll('meta'),
  ]);
}

beforeAll(async () => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
  const study = await createStudy({ name: 'Sedge, north <b>meadow</b>', setup }, 'phone-A');
  for (const [i, v] of [3, 0, 5, 2, 7, 1, 4].entries())
    await addEntry(study.id, { value: v, label: `Q${i + 1}` }, 'phone-A');
  const recs = await listObservations(study.id);
  await voidEntry(study.id, recs[1]!.id, 'keyed twice', 'phone-A');
  phoneBundle = await makeBundle((await getStudy(study.id))!, await listObservations(study.id));
  before = await dump();
});

async function expectRefusedAndUnchanged(file: string): Promise<void> {
  const out = await importBundleText(file);
  expect(out.ok).toBe(false);
  if (out.ok) return;
  expectClearProblems(out.problems.map((p) => p.replace(/^refused: /, 'file: ')));
  expect(await dump()).toBe(before);
}

/** A well-formed file: the phone's study with `events`, renumbered and checksummed. */
async function fileOf(events: ObservationRecord[], setupOver: Partial<StudySetup> = {}): Promise<string> {
  const study = { ...phoneBundle.study, setup: { ...phoneBundle.study.setup, ...setupOver } };
  const evs = events.map((e, i) => ({ ...e, seq: i + 1 }));
  return JSON.stringify({
    format: phoneBundle.format,
    version: phoneBundle.version,
    study,
    events: evs,
    checksum: { algorithm: 'SHA-256', value: await bundleChecksum(study, evs) },
  });
}

/** New, valid entries for the phone's study. */
const newEntries = fc.uniqueArray(fc.tuple(uuidArb, fc.nat({ max: 50 })), {
  minLength: 1,
  maxLength: 5,
  selector: ([id]) => id,
});
const toEvents = (xs: [string, number][]): ObservationRecord[] =>
  xs.map(([id, value], i) => ({
    id,
    studyId: phoneBundle.study.id,
    seq: 0,
    at: `2026-05-05T10:${String(i).padStart(2, '0')}:00+02:00`,
    value,
    device: 'phone-B',
  }));

describe('bundle import into the phone under fuzzing: refused files leave the database unchanged', () => {
  it('sanity: the untouched export imports as "already present" and changes nothing', async () => {
    const out = await importBundleText(JSON.stringify(phoneBundle));
    expect(out).toMatchObject({ ok: true, added: 0, alreadyPresent: phoneBundle.events.length });
    expect(await dump()).toBe(before);
  });

  it('faults planted in the phone’s own export: refused, database unchanged (700 files)', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.constant(null).chain(() => faultsIn(phoneBundle)),
        async (f) => expectRefusedAndUnchanged(f.file),
      ),
      { numRuns: 700 },
    );
  });

  it('random malformed bundles: refused, database unchanged (400 files)', async () => {
    await fc.assert(
      fc.asyncProperty(faultArb, async (f) => expectRefusedAndUnchanged(f.file)),
      { numRuns: 400 },
    );
  });

  it('well-formed but conflicting files: refused as a whole, new entries in them not written (150 files)', async () => {
    const entriesHere = phoneBundle.events.filter((e) => e.voids === undefined);
    await fc.assert(
      fc.asyncProperty(
        newEntries,
        fc.constantFrom('setup', 'content'),
        fc.nat({ max: entriesHere.length - 1 }),
        async (fresh, conflict, k) => {
          const events = [...phoneBundle.events, ...toEvents(fresh)];
          let file: string;
          if (conflict === 'setup') file = await fileOf(events, { level: 0.9 });
          else {
            const changed = { ...entriesHere[k]!, value: (entriesHere[k]!.value ?? 0) + 1 };
            file = await fileOf([...events, changed].filter((e) => e !== entriesHere[k]));
          }
          await expectRefusedAndUnchanged(file);
        },
      ),
      { numRuns: 150 },
    );
  });
});
