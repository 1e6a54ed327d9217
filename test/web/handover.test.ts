// Hand-over in the app against fake-indexeddb (an in-memory implementation of the W3C IndexedDB API):
// import validates first and writes in one transaction or not at all; the same bundle twice changes
// nothing; a phone's own export re-imported into a fresh database gives identical statistics.
import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import { beforeEach, describe, expect, it } from 'vitest';
import { assess } from '../../src/index.ts';
import type { ObservationRecord, StudySetup } from '../../src/model/records.ts';
import { makeBundle, pointsOf, serializeBundle } from '../../web/handover/core-handover.ts';
import { buildExport } from '../../web/handover/files.ts';
import { importBundleText } from '../../web/handover/import.ts';
import { getDb, resetDbForTests } from '../../web/storage/db.ts';
import { addEntry, listObservations, voidEntry } from '../../web/storage/observations.ts';
import { createStudy, getStudy, listStudies } from '../../web/storage/studies.ts';

const setup: StudySetup = {
  kind: 'count',
  level: 0.95,
  sided: 'two',
  rule: 'standard',
  min: 5,
  target: { kind: 'precision', value: 0.25 },
  plotArea: 1,
  plotAreaUnit: 'm2',
  taxon: 'Carex nigra',
};

beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});

async function dump(): Promise<string> {
  const db = await getDb();
  return JSON.stringify([
    await db.getAll('studies'),
    await db.getAll('observations'),
    await db.getAll('exports'),
  ]);
}

async function phoneStudy(device: string, values: number[], labelPrefix = 'Q') {
  const study = await createStudy({ name: 'Sedge, north', setup }, device);
  for (const [i, v] of values.entries())
    await addEntry(study.id, { value: v, label: `${labelPrefix}${i + 1}` }, device);
  return study;
}

describe('import', () => {
  it("round trip: a phone's export imported into a fresh database gives the same log and statistics", async () => {
    const study = await phoneStudy('phone-A', [3, 0, 5, 2, 7, 1, 4]);
    const recs = await listObservations(study.id);
    await voidEntry(study.id, recs[1]!.id, 'keyed twice', 'phone-A');
    const stored = (await getStudy(study.id))!;
    const log = await listObservations(study.id);
    const built = await buildExport('bundle', stored, log);
    if (!built.ok) throw new Error(built.message);
    const text = built.files[0]!.text;
    const before = assess(pointsOf(log), stored.setup);

    resetDbForTests();
    globalThis.indexedDB = new IDBFactory(); // a fresh profile
    const r = await importBundleText(text);
    expect(r.ok).toBe(true);
    const after = await listObservations(study.id);
    expect(after.map((e) => [e.id, e.seq, e.value, e.voids])).toEqual(
      log.map((e) => [e.id, e.seq, e.value, e.voids]),
    );
    const a2 = assess(pointsOf(after), (await getStudy(study.id))!.setup);
    expect(a2).toEqual(before);
    // and the same bundle twice changes nothing
    const snapshot = await dump();
    const again = await importBundleText(text);
    expect(again.ok && again.added).toBe(0);
    expect(await dump()).toBe(snapshot);
  });

  it('pools another phone: union by id, appended after the last seq, duplicates flagged, shares reported', async () => {
    const study = await phoneStudy('phone-A', [3, 0, 5]);
    const stored = (await getStudy(study.id))!;
    const other: ObservationRecord[] = [4, 2].map((value, i) => ({
      id: `00000000-0000-4000-8000-00000000000${i + 1}`,
      studyId: study.id,
      seq: i + 1,
      at: `2026-05-04T10:0${i}:00+02:00`,
      value,
      device: 'phone-B',
      label: i === 0 ? 'Q2' : 'Q9',
    }));
    const r = await importBundleText(serializeBundle(await makeBundle(stored, other)));
    if (!r.ok) throw new Error(r.problems.join());
    expect(r.added).toBe(2);
    expect(r.created).toBe(false);
    const log = await listObservations(study.id);
    expect(log.map((e) => e.seq)).toEqual([1, 2, 3, 4, 5]);
    expect(log.map((e) => e.value)).toEqual([3, 0, 5, 4, 2]);
    expect(r.duplicates.map((d) => [d.label, d.devices])).toEqual([['Q2', ['phone-A', 'phone-B']]]);
    expect(r.shares.map((s) => [s.device, s.counted])).toEqual([
      ['phone-A', 3],
      ['phone-B', 2],
    ]);
  });

  it('malformed, damaged or conflicting files leave the database exactly as it was', async () => {
    const study = await phoneStudy('phone-A', [3, 0, 5]);
    const stored = (await getStudy(study.id))!;
    const good = serializeBundle(await makeBundle(stored, await listObservations(study.id)));
    const snapshot = await dump();
    const cases: [string, RegExp][] = [
      ['{"format":', /^file: not valid JSON/],
      [good.replace('"version": 1', '"version": 2'), /^version: /],
      [good.replace('"value": 5', '"value": 6'), /^checksum\.value: does not match/],
      [
        serializeBundle(await makeBundle({ ...stored, setup: { ...setup, level: 0.9 } }, [])),
        /^refused: .*different setup/,
      ],
    ];
    for (const [text, message] of cases) {
      const r = await importBundleText(text);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.problems[0]).toMatch(message);
      expect(await dump()).toBe(snapshot);
    }
    // a conflict found after some events were already checked: nothing of the file is written
    const log = await listObservations(study.id);
    const altered = [
      { ...log[0]!, id: '00000000-0000-4000-8000-0000000000aa', seq: 1 },
      { ...log[1]!, seq: 2, value: 9 },
    ];
    const r = await importBundleText(serializeBundle(await makeBundle(stored, altered)));
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.problems[0]).toMatch(
        /differs from the event with the same id already held; one of the files was altered/,
      );
    expect(await dump()).toBe(snapshot);
    expect(await listStudies()).toHaveLength(1);
  });
});
