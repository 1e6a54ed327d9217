// One pooling rule on both surfaces: `sure-enough merge` (mergeBundles) and the phone's import
// (importBundleText into fake-indexeddb, an in-memory implementation of the W3C Indexed Database API) are
// fed the same two files and must agree — accept or refuse with the same words, the same counts added and
// already present, the same likely duplicates and collectors' shares, and the same set of events (by id and
// content; only seq may differ: merge re-sequences, the phone appends).
// Expected figures are derived by hand from the constructed logs (evidence: derived); the set semantics are
// those of a grow-only set (Shapiro, Preguiça, Baquero & Zawirski 2011, "Conflict-free replicated data
// types", §3.3.1 G-Set): union by id, order of arrival irrelevant, the same file twice changes nothing.
import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import { beforeEach, describe, expect, it } from 'vitest';
import { type Bundle, makeBundle, serializeBundle } from '../../src/bundle/bundle.ts';
import { canonicalJson } from '../../src/bundle/canonical.ts';
import { logCounts, pointsOf } from '../../src/bundle/events.ts';
import { mergeBundles } from '../../src/bundle/merge.ts';
import type { ObservationRecord } from '../../src/model/records.ts';
import { importBundleText } from '../../web/handover/import.ts';
import { getDb, resetDbForTests } from '../../web/storage/db.ts';
import { listObservations, voidEntry } from '../../web/storage/observations.ts';
import { entries, study, uuid, voidOf } from '../core/bundle/make.ts';

const st = study();
// Phone A: Q1–Q4, then withdraws Q2.
const a = entries(st, [3, 0, 5, 2], 'phone-A', 2, 0, (i) => ({ label: `Q${i + 1}` }));
const voidA = voidOf(st, a[1]!, 5, uuid(3, 1), 'keyed twice');
// Phone B had imported A's first two entries, recorded three of its own (its Q3 clashes with A's Q3) and
// withdrew A's Q2 too — a second void of one entry, from another phone.
const bOwn = entries(st, [4, 1, 6], 'phone-B', 4, 10, (i) => ({ label: ['Q3', 'Q11', 'Q12'][i]! }));
const voidB: ObservationRecord = { ...voidOf(st, a[1]!, 6, uuid(6, 1), 'seen twice'), device: 'phone-B' };
voidB.at = '2026-05-04T09:20:00+02:00';

const seqd = (evs: ObservationRecord[]) => evs.map((e, i) => ({ ...e, seq: i + 1 }));
const A = await makeBundle(st, seqd([...a, voidA]));
const B = await makeBundle(st, seqd([a[0]!, a[1]!, ...bOwn, voidB]));

/** Events by id with their content (everything but seq). */
const contentById = (evs: readonly ObservationRecord[]) =>
  Object.fromEntries(evs.map((e) => [e.id, canonicalJson({ ...e, seq: 0 })]));

async function dump(): Promise<string> {
  const db = await getDb();
  return JSON.stringify([await db.getAll('studies'), await db.getAll('observations')]);
}

interface Outcome {
  ok: boolean;
  message?: string;
  report?: Record<string, unknown>;
  events?: Record<string, string>;
  counted?: number[];
}

async function viaMerge(held: Bundle, file: Bundle): Promise<Outcome> {
  const r = await mergeBundles(held, file);
  if (!r.ok) return { ok: false, message: r.message };
  const { added, alreadyPresent, duplicates, shares, studyDiffers } = r.report;
  return {
    ok: true,
    report: { added, alreadyPresent, duplicates, shares, studyDiffers },
    events: contentById(r.bundle.events),
    counted: pointsOf(r.bundle.events).map((p) => p.value),
  };
}

/** A fresh phone imports `held`, then `file`; a refused file must leave the database as it was. */
async function viaPhone(held: Bundle, file: Bundle): Promise<Outcome> {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
  const first = await importBundleText(serializeBundle(held));
  if (!first.ok) throw new Error(first.problems.join('\n'));
  const before = await dump();
  const r = await importBundleText(serializeBundle(file));
  if (!r.ok) {
    expect(await dump()).toBe(before);
    expect(r.problems).toHaveLength(1);
    return { ok: false, message: r.problems[0]! };
  }
  const { added, alreadyPresent, duplicates, shares, studyDiffers } = r;
  const log = await listObservations(st.id);
  return {
    ok: true,
    report: { added, alreadyPresent, duplicates, shares, studyDiffers },
    events: contentById(log),
    counted: pointsOf(log).map((p) => p.value),
  };
}

async function bothSurfaces(held: Bundle, file: Bundle): Promise<Outcome> {
  const merged = await viaMerge(held, file);
  const phone = await viaPhone(held, file);
  expect(phone).toEqual({ ...merged, counted: phone.counted });
  // counted values as a multiset (their order follows each surface's seq)
  expect([...(phone.counted ?? [])].sort()).toEqual([...(merged.counted ?? [])].sort());
  return merged;
}

beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});

describe('merge and the phone pool by one rule', () => {
  it('two voids of one entry from two phones: both kept on both surfaces, the entry voided once', async () => {
    const r = await bothSurfaces(A, B);
    expect(r.ok).toBe(true);
    // B brings Q3, Q11, Q12 and its void (4); A's Q1 and Q2 were already held (2)
    expect(r.report).toMatchObject({ added: 4, alreadyPresent: 2, studyDiffers: [] });
    expect(Object.keys(r.events!).sort()).toEqual([...a, voidA, ...bOwn, voidB].map((e) => e.id).sort());
    // 7 entries, Q2 voided (by both phones): 6 counted, 2 void records
    const log = await listObservations(st.id);
    expect(logCounts(log)).toEqual({ entries: 7, counted: 6, voided: 1, voidRecords: 2 });
    expect([...r.counted!].sort()).toEqual([1, 2, 3, 4, 5, 6]);
    expect(r.report!.duplicates).toEqual([
      { label: 'Q3', ids: [a[2]!.id, bOwn[0]!.id], devices: ['phone-A', 'phone-B'] },
    ]);
    expect(r.report!.shares).toEqual([
      { device: 'phone-A', entries: 4, counted: 3, voids: 1, share: 0.5 },
      { device: 'phone-B', entries: 3, counted: 3, voids: 1, share: 0.5 },
    ]);
    // the phone itself still refuses to void the entry again
    await expect(voidEntry(st.id, a[1]!.id, 'once more', 'phone-A')).rejects.toMatchObject({
      code: 'AlreadyVoided',
    });
  });

  it('the order of arrival does not matter: B then A gives the same events and figures', async () => {
    const ab = await bothSurfaces(A, B);
    const ba = await bothSurfaces(B, A);
    expect(ba.events).toEqual(ab.events);
    expect(ba.report).toMatchObject({ added: 3, alreadyPresent: 2 });
    expect(ba.report!.duplicates).toEqual(ab.report!.duplicates);
    expect(ba.report!.shares).toEqual(ab.report!.shares);
  });

  it('the same file twice changes nothing', async () => {
    const r = await bothSurfaces(A, A);
    expect(r.report).toMatchObject({ added: 0, alreadyPresent: 5 });
  });

  it('an event altered in one file: both refuse with the same words, naming the event', async () => {
    const altered = await makeBundle(st, seqd([{ ...a[0]!, value: 30 }, a[1]!, ...bOwn, voidB]));
    const r = await bothSurfaces(A, altered);
    expect(r.ok).toBe(false);
    expect(r.message).toBe(
      `refused: event ${a[0]!.id} (seq 1 in this file) differs from the event with the same id already held; one of the files was altered`,
    );
  });

  it('the same study with another setup: both refuse with the same words, naming the difference', async () => {
    const other = { ...st, setup: { ...st.setup, level: 0.9 } };
    const r = await bothSurfaces(A, await makeBundle(other, seqd([...bOwn])));
    expect(r.ok).toBe(false);
    expect(r.message).toBe(
      'refused: study "Sedge plots, north meadow" has a different setup in this file (level: 0.95 vs 0.9 in this file); entries taken under different setups cannot be pooled',
    );
  });

  it('study records that differ outside the setup are named on both surfaces', async () => {
    const desk = { ...st, name: 'Sedge plots (desk copy)', notes: 'typed at the desk' };
    const r = await bothSurfaces(A, await makeBundle(desk, seqd([...bOwn])));
    expect(r.report).toMatchObject({ added: 3, alreadyPresent: 0, studyDiffers: ['name', 'notes'] });
  });
});
