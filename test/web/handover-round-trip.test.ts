/**
 * The app's hand-over files read back, against fake-indexeddb (an in-memory implementation of the W3C
 * IndexedDB API): for each data kind, a study recorded through the app's storage (entries with field
 * notes holding commas, quotes and line breaks, a void) and exported as the app exports it
 * (web/handover/files.ts: bundle, CSV + dictionary) gives the app's figures when
 * - `sure-enough assess` reads the bundle (its setup) or the CSV export (with the report's flags), and
 * - the bundle is imported into a fresh phone (web/handover/import.ts);
 * and a bundle from a newer format version is refused by the app's import, naming both versions, with the
 * database left exactly as it was, while the current version (test/fixtures/bundle-format-v1.bundle.json)
 * is imported.
 */
import 'fake-indexeddb/auto';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { IDBFactory } from 'fake-indexeddb';
import { beforeEach, describe, expect, it } from 'vitest';
import { commands } from '../../src/cli/commands.ts';
import { type FlagSpec, parseArgs } from '../../src/cli/io.ts';
import { assessArgs } from '../../src/export/recipe.ts';
import { assess } from '../../src/index.ts';
import type { StudySetup } from '../../src/model/records.ts';
import { pointsOf } from '../../web/handover/core-handover.ts';
import { buildExport } from '../../web/handover/files.ts';
import { importBundleText } from '../../web/handover/import.ts';
import { getDb, resetDbForTests } from '../../web/storage/db.ts';
import { addEntry, listObservations, voidEntry } from '../../web/storage/observations.ts';
import { createStudy, getStudy } from '../../web/storage/studies.ts';
import zarr13 from '../fixtures/stats-zarr13.json';

const base = { level: 0.95, sided: 'two', rule: 'standard', min: 5 } as const;
// NIST/SEMATECH e-Handbook ZARR13 heat flow meter data, first twelve values
const zarr = (zarr13.values as number[]).slice(0, 12);
const kinds: { name: string; setup: StudySetup; values: { value: number; censored?: boolean }[] }[] = [
  {
    name: 'measurement with a non-detect',
    setup: { ...base, kind: 'measurement', unit: 'W/m2K', target: { kind: 'margin', value: 0.02 } },
    values: [...zarr.map((value) => ({ value })), { value: 9.2, censored: true }],
  },
  {
    name: 'count',
    setup: {
      ...base,
      kind: 'count',
      plotArea: 1,
      plotAreaUnit: 'm2',
      target: { kind: 'precision', value: 0.25 },
    },
    // Bortkiewicz (1898) horse-kick deaths, a run of corps-years (order not published)
    values: [0, 1, 0, 2, 0, 1, 0, 1, 3, 0, 1, 2, 0, 4, 1].map((value) => ({ value })),
  },
  {
    name: 'pass/fail',
    setup: { ...base, kind: 'pass-fail', outcomeName: 'above 9.28', target: { kind: 'margin', value: 0.2 } },
    values: zarr.map((v) => ({ value: v > 9.28 ? 1 : 0 })),
  },
];
const NOTES = ['wet, soft', 'said "5"', 'two\r\nlines', 'a "b", c\nd'];

beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});

async function dump(): Promise<string> {
  const db = await getDb();
  return JSON.stringify([await db.getAll('studies'), await db.getAll('observations')]);
}

const dir = mkdtempSync(join(tmpdir(), 'app-round-trip-'));
async function cli(cmd: string, argv: string[]): Promise<Record<string, unknown>> {
  const command = commands[cmd]!;
  return JSON.parse(await command.run(parseArgs(argv, (command as { flags?: FlagSpec }).flags ?? {}, cmd)));
}

describe.each(kinds)('$name: recorded in the app, exported, read back', ({ setup, values }) => {
  it('assess reads the app bundle and the app CSV; a fresh phone imports the bundle; all give the app figures', async () => {
    const study = await createStudy({ name: 'Round trip, "north"', setup }, 'phone, A');
    for (const [i, v] of values.entries())
      await addEntry(study.id, { ...v, label: `Q${i + 1}`, note: NOTES[i % NOTES.length]! }, 'phone, A');
    const first = await listObservations(study.id);
    await voidEntry(study.id, first[2]!.id, 'keyed "twice", sorry', 'phone, A');
    const stored = (await getStudy(study.id))!;
    const log = await listObservations(study.id);
    const app = assess(pointsOf(log), stored.setup);

    const bundle = await buildExport('bundle', stored, log);
    const csv = await buildExport('csv', stored, log);
    if (!bundle.ok || !csv.ok) throw new Error('export failed');
    const bundleFile = join(dir, `${setup.kind}.bundle.json`);
    const csvFile = join(dir, `${setup.kind}.csv`);
    writeFileSync(bundleFile, bundle.files[0]!.text);
    writeFileSync(csvFile, csv.files[0]!.text);

    for (const out of [
      await cli('assess', [bundleFile]),
      await cli('assess', [csvFile, ...assessArgs(setup)]),
    ]) {
      expect(out.n).toBe(app.n);
      expect(out.n).toBe(values.length - 1);
      for (const k of ['estimate', 'lower', 'upper', 'level', 'more', 'details', 'warnings'] as const)
        expect(out[k], k).toEqual(app[k]);
      expect(out.verdict).toBe(app.verdict.status);
      expect(out.reason).toBe(app.verdict.message);
    }

    resetDbForTests();
    globalThis.indexedDB = new IDBFactory();
    const imported = await importBundleText(bundle.files[0]!.text);
    expect(imported.ok).toBe(true);
    const again = await listObservations(study.id);
    expect(assess(pointsOf(again), (await getStudy(study.id))!.setup)).toEqual(app);
    expect(again.map((r) => r.note)).toEqual(log.map((r) => r.note));
  });
});

describe('bundle format versions in the app', () => {
  const fixture = readFileSync(
    join(import.meta.dirname, '..', 'fixtures', 'bundle-format-v1.bundle.json'),
    'utf8',
  );

  it('a bundle from a newer version is refused naming both versions; nothing changes', async () => {
    const study = await createStudy({ name: 'Held', setup: kinds[1]!.setup }, 'phone-A');
    await addEntry(study.id, { value: 3 }, 'phone-A');
    const before = await dump();
    const newer = fixture.replace('"version": 1,', '"version": 2,');
    expect(newer).not.toBe(fixture);
    const r = await importBundleText(newer);
    expect(r).toEqual({
      ok: false,
      problems: [
        'version: this file is bundle format version 2, made by a newer version of Sure Enough; this program reads bundle format version 1 and older. Update the program to read it.',
      ],
    });
    expect(await dump()).toBe(before);
  });

  it('a bundle of the current version (1, the first format: no older one exists) is imported as it is', async () => {
    const r = await importBundleText(fixture);
    expect(r.ok && r.added).toBe(4);
  });
});
