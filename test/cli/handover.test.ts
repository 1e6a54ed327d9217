/**
 * The hand-over commands end to end (in process: each command's run() gives stdout or throws the
 * UsageError that main.ts turns into exit code 2 with nothing on stdout).
 * Outside checks: Python's csv module reads the CSV export; `assess` on the union of both phones' values
 * gives the same summary as the merged bundle (the core assess is the reference the app also uses).
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { assess } from '../../src/assess/index.ts';
import { serializeBundle } from '../../src/bundle/bundle.ts';
import { pointsOf } from '../../src/bundle/events.ts';
import { parseBundle } from '../../src/bundle/validate.ts';
import { commands } from '../../src/cli/commands.ts';
import { type FlagSpec, parseArgs, UsageError } from '../../src/cli/io.ts';
import { mergeFiles } from '../../src/cli/merge.ts';
import { pythonOracle } from '../fixtures/python-oracle.ts';

// Python's csv module, run once and committed (test/fixtures/python-handover.json)
const python = pythonOracle('handover');

const dir = mkdtempSync(join(tmpdir(), 'handover-'));
const fixture = (name: string) => new URL(`../fixtures/${name}`, import.meta.url).pathname;
const ID = '0f8fad5b-d9cb-469f-a165-70867728950e';
const STUDY = ['--kind', 'count', '--target', 'precision:0.2', '--plot-area', '0.25'];
const OWN = ['--plot-area-unit', 'm2', '--taxon', 'Carex nigra', '--name', 'Sedge plots', '--id', ID];

async function run(cmd: string, argv: string[]): Promise<string> {
  const command = commands[cmd]!;
  return command.run(parseArgs(argv, (command as { flags?: FlagSpec }).flags ?? {}, cmd));
}
function write(name: string, text: string): string {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
}
async function fails(cmd: string, argv: string[]): Promise<string> {
  try {
    await run(cmd, argv);
  } catch (err) {
    expect(err).toBeInstanceOf(UsageError);
    return (err as Error).message;
  }
  throw new Error('expected a UsageError');
}

const A = write(
  'a.json',
  await run('bundle', [
    fixture('handover-counts-a.txt'),
    ...STUDY,
    ...OWN,
    '--device',
    'phone-A',
    '--at',
    '2026-05-04T09:00:00+02:00',
  ]),
);
const B = write(
  'b.json',
  await run('bundle', [
    fixture('handover-counts-b.txt'),
    ...STUDY,
    ...OWN,
    '--device',
    'phone-B',
    '--at',
    '2026-05-04T09:00:05+02:00',
  ]),
);

describe('bundle', () => {
  it('builds a valid bundle from values; the same input gives the same bundle', async () => {
    const r = await parseBundle(readFileSync(A, 'utf8'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.bundle.events.map((e) => e.value)).toEqual([3, 0, 5, 2, 7, 0, 1, 4, 2, 3, 6, 1]);
    expect(r.bundle.events[11]!.at).toBe('2026-05-04T09:00:11+02:00');
    expect(r.bundle.study.setup).toMatchObject({
      kind: 'count',
      plotArea: 0.25,
      plotAreaUnit: 'm2',
      taxon: 'Carex nigra',
    });
    const again = await run('bundle', [
      fixture('handover-counts-a.txt'),
      ...STUDY,
      ...OWN,
      '--device',
      'phone-A',
      '--at',
      '2026-05-04T09:00:00+02:00',
    ]);
    expect(again).toBe(readFileSync(A, 'utf8'));
  });
  it('a laboratory CSV with a non-detect', async () => {
    const out = await run('bundle', [
      fixture('handover-lab.csv'),
      '--kind',
      'measurement',
      '--unit',
      'mg/kg',
      '--at',
      '2026-05-06T14:00:00Z',
    ]);
    const r = await parseBundle(out);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.bundle.events.map((e) => [e.value, e.censored ?? false])).toEqual([
      [12.5, false],
      [0.5, true],
      [301, false],
      [44.25, false],
    ]);
  });
  it('refuses bad flags and bad values, naming them', async () => {
    expect(await fails('bundle', [fixture('handover-counts-a.txt'), ...STUDY, '--id', 'not-a-uuid'])).toMatch(
      /^flag --id/,
    );
    expect(
      await fails('bundle', [fixture('handover-counts-a.txt'), ...STUDY, '--at', '2026-05-04 09:00']),
    ).toMatch(/^flag --at/);
    expect(await fails('bundle', [fixture('handover-lab.csv'), '--kind', 'count'])).toMatch(/line \d/);
    expect(await fails('bundle', [fixture('handover-counts-a.txt'), ...STUDY, '--colour', 'red'])).toMatch(
      /unknown flag --colour/,
    );
  });
});

describe('bundle: per-entry columns and field designs', () => {
  const LAB = [
    'value;stratum;cluster;label;at;lat;lon;accuracy_m;note;device;sample',
    '12,5;wet meadow;T1;Q1;2026-05-04T09:15:00+02:00;52,0907;5,1214;4;"first; ""clean"" plot";phone-A;S1',
    '<0,5;wet meadow;T1;Q2;2026-05-04T09:20:30+02:00;52,0911;5,1209;3,5;;phone-A;S2',
    '8,25;dry;T2;Q3;;;;;;;S3',
    '9;dry;T2;Q4;2026-05-04T07:40:00Z;-33,9;-70,6;0;gravel;phone-B;S4',
    '',
  ].join('\r\n');
  const FLAGS = [
    '--kind',
    'measurement',
    '--strata',
    'wet meadow:0.7,dry:0.3',
    '--cost',
    'dry:2',
    '--id',
    ID,
  ];

  it('carries stratum, cluster, label, time, position, note and device into the events', async () => {
    const out = await run('bundle', [write('lab-full.csv', LAB), ...FLAGS, '--device', 'lab']);
    const r = await parseBundle(out);
    if (!r.ok) throw new Error(r.problems.join('\n'));
    const ev = r.bundle.events;
    expect(r.bundle.study.setup.strata).toEqual([
      { name: 'wet meadow', weight: 0.7 },
      { name: 'dry', weight: 0.3, cost: 2 },
    ]);
    expect(ev.map((e) => [e.value, e.censored ?? false, e.stratum, e.cluster, e.label])).toEqual([
      [12.5, false, 'wet meadow', 'T1', 'Q1'],
      [0.5, true, 'wet meadow', 'T1', 'Q2'],
      [8.25, false, 'dry', 'T2', 'Q3'],
      [9, false, 'dry', 'T2', 'Q4'],
    ]);
    expect(ev.map((e) => e.position)).toEqual([
      { lat: 52.0907, lon: 5.1214, accuracyM: 4 },
      { lat: 52.0911, lon: 5.1209, accuracyM: 3.5 },
      undefined,
      { lat: -33.9, lon: -70.6, accuracyM: 0 },
    ]);
    expect(ev.map((e) => e.device)).toEqual(['phone-A', 'phone-A', 'lab', 'phone-B']);
    expect(ev[0]!.note).toBe('first; "clean" plot');
    expect(ev[1]!.note).toBeUndefined();
    // without --at, the study starts at the earliest "at" cell (07:40Z = 09:40+02:00 is later than 09:15+02:00);
    // entry 3 has no time and gets createdAt + 2 s
    expect(r.bundle.study.createdAt).toBe('2026-05-04T09:15:00+02:00');
    expect(ev.map((e) => e.at)).toEqual([
      '2026-05-04T09:15:00+02:00',
      '2026-05-04T09:20:30+02:00',
      '2026-05-04T09:15:02+02:00',
      '2026-05-04T07:40:00Z',
    ]);
    // the same file and flags give the same bundle (ids derived, no clock)
    expect(await run('bundle', [write('lab-full2.csv', LAB), ...FLAGS, '--device', 'lab'])).toBe(out);
    // and the CSV export gives the cells back, read by Python's csv module
    const rows: string[][] = JSON.parse(
      python(
        'import sys,csv,io,json; print(json.dumps(list(csv.reader(io.StringIO(sys.stdin.read(), newline="")))))',
        await run('export', ['--format', 'csv', write('lab-full.json', out)]),
      ),
    );
    const col = (name: string) => rows.slice(1).map((x) => x[rows[0]!.indexOf(name)]);
    expect(col('stratum')).toEqual(['wet meadow', 'wet meadow', 'dry', 'dry']);
    expect(col('cluster')).toEqual(['T1', 'T1', 'T2', 'T2']);
    expect(col('label')).toEqual(['Q1', 'Q2', 'Q3', 'Q4']);
    expect(col('latitude')).toEqual(['52.0907', '52.0911', '', '-33.9']);
    expect(col('note')[0]).toBe('first; "clean" plot');
    expect(col('censored')).toEqual(['false', 'true', 'false', 'false']);
  });

  it('value,stratum,cluster lines keep their stratum and primary unit', async () => {
    const out = await run('bundle', [
      write('lines.txt', '4,2\n5.5,wet meadow,T1\n6,dry\n7,,T9\n'),
      '--kind',
      'measurement',
      '--at',
      '2026-05-04T09:00:00Z',
    ]);
    const r = await parseBundle(out);
    if (!r.ok) throw new Error(r.problems.join('\n'));
    expect(r.bundle.events.map((e) => [e.value, e.stratum, e.cluster])).toEqual([
      [4.2, undefined, undefined],
      [5.5, 'wet meadow', 'T1'],
      [6, 'dry', undefined],
      [7, undefined, 'T9'],
    ]);
  });

  it('bad cells are refused with their line named', async () => {
    const bad = (lines: string[], extra: string[] = []) =>
      fails('bundle', [write('bad.csv', lines.join('\n')), ...FLAGS, ...extra]);
    const H = 'value,stratum,at,lat,lon,accuracy_m';
    expect(await bad([H, '1,dry,2026-05-04 09:00,,,', '2,dry,,,,'])).toBe(
      'line 2: "at" "2026-05-04 09:00" is not an ISO 8601 time with seconds and UTC offset (e.g. 2026-05-04T09:15:00+02:00)',
    );
    expect(await bad([H, '1,dry,2026-02-30T09:00:00Z,,,'])).toMatch(
      /^line 2: "at" "2026-02-30T09:00:00Z" is not/,
    );
    expect(await bad([H, '1,dry,,,,', '2,dry,,91,5,3'])).toBe('line 3: "lat" 91 is outside -90…90 degrees');
    expect(await bad([H, '1,dry,,52.1,5.2,'])).toBe(
      'line 2: a position needs lat, lon and accuracy_m together; "accuracy_m" is empty',
    );
    expect(await bad([H, '1,dry,,52.1,,'])).toBe(
      'line 2: a position needs lat, lon and accuracy_m together; "lon" and "accuracy_m" are empty',
    );
    expect(await bad([H, '1,dry,,52.1,5.2,-1'])).toBe('line 2: "accuracy_m" -1 must be ≥ 0 (metres)');
    expect(await bad([H, '1,dry,,52.1,east,3'])).toBe('line 2: "lon" "east" is not a number');
    expect(await bad(['# lab run 7', H, '1,wodland,,,,'])).toBe(
      'line 3: stratum "wodland" is not one --strata declares ("wet meadow", "dry")',
    );
    expect(await bad([H, '1,,,,,'])).toBe('line 2: no stratum given; --strata declares "wet meadow", "dry"');
    // several problems: each named by its line
    expect((await bad([H, '1,dry,yesterday,,,', '2,dry,,100,0,1'])).split('\n')).toEqual([
      expect.stringMatching(/^line 2: "at"/),
      expect.stringMatching(/^line 3: "lat" 100/),
    ]);
  });

  it('help bundle documents the columns', async () => {
    const h = await run('help', ['bundle']);
    for (const c of ['label', 'at', 'lat, lon', 'accuracy_m', 'note', 'device'])
      expect(h).toContain(`  ${c} `);
    expect(h).toMatch(/stratum/);
  });
});

// Two phones' stratified bundles and their merge (top level: building them is asynchronous).
const STRATA = [
  '--kind',
  'measurement',
  '--target',
  'margin:1.5',
  '--strata',
  'woodland:0.6,meadow:0.4',
  '--cost',
  'woodland:1,meadow:3',
];
const phoneA =
  '12.1,woodland\n8.2,meadow\n14.3,woodland\n9.1,meadow\n11.8,woodland\n7.6,meadow\n13.9,woodland\n';
const phoneB = '8.8,meadow\n12.7,woodland\n9.4,meadow\n15.2,woodland\n8.0,meadow\n';
const SA = write(
  'strata-a.json',
  await run('bundle', [
    write('strata-a.txt', phoneA),
    ...STRATA,
    '--id',
    ID,
    '--device',
    'phone-A',
    '--at',
    '2026-05-04T09:00:00+02:00',
  ]),
);
const SB = write(
  'strata-b.json',
  await run('bundle', [
    write('strata-b.txt', phoneB),
    ...STRATA,
    '--id',
    ID,
    '--device',
    'phone-B',
    '--at',
    '2026-05-04T09:00:03+02:00',
  ]),
);
const mergedStrata = await parseBundle((await mergeFiles([SA, SB])).out);
if (!mergedStrata.ok) throw new Error(mergedStrata.problems.join('\n'));
const m = mergedStrata.bundle;

describe('merge with strata equals assess on the union with the same strata flags', () => {
  it('the same stratified figures as assess on the two files concatenated', async () => {
    const fromMerge = assess(pointsOf(m.events), m.study.setup);
    expect(fromMerge.method).toBe('stratified-t');
    expect(fromMerge.n).toBe(12);
    const viaCli = JSON.parse(await run('assess', [write('strata-union.txt', phoneA + phoneB), ...STRATA]));
    expect(viaCli.method).toBe('stratified-t');
    expect(viaCli.n).toBe(fromMerge.n);
    // the stratified mean and its interval do not depend on the order of entry (hand check of the mean:
    // woodland 12.1, 14.3, 11.8, 13.9, 12.7, 15.2 → 80/6; meadow 8.2, 9.1, 7.6, 8.8, 9.4, 8.0 → 51.1/6)
    expect(fromMerge.estimate!).toBeCloseTo(0.6 * (80 / 6) + 0.4 * (51.1 / 6), 12);
    for (const k of ['estimate', 'lower', 'upper', 'level'] as const)
      expect(Math.abs(viaCli[k] - (fromMerge[k] as number)), k).toBeLessThan(1e-12);
    expect(viaCli.verdict).toBe(fromMerge.verdict.status);
    expect(viaCli.details.whereNext).toBe(fromMerge.details.whereNext);
    expect(viaCli.details['stratum.meadow.n']).toBe(6);
  });
  it('and exactly with the values the merged bundle exports, in its log order', async () => {
    const values = write(
      'strata-values.csv',
      await run('export', ['--format', 'values', write('strata-m.json', serializeBundle(m))]),
    );
    const viaCli = JSON.parse(await run('assess', [values, ...STRATA]));
    const fromMerge = assess(pointsOf(m.events), m.study.setup);
    for (const k of ['n', 'estimate', 'lower', 'upper', 'level'] as const)
      expect(viaCli[k], k).toBe(fromMerge[k]);
    expect(viaCli.more).toEqual(fromMerge.more);
  });
});

const { out, summary } = await mergeFiles([A, B]);
const merged = await parseBundle(out);
if (!merged.ok) throw new Error(merged.problems.join('\n'));
const M = write('m.json', out);

describe('merge', () => {
  it("gives the same summary as assess on the union of both phones' values", async () => {
    const union = merged.bundle.events.map((e) => e.value).join('\n');
    const viaCli = JSON.parse(await run('assess', [write('union.txt', union), ...STUDY]));
    const fromBundle = assess(pointsOf(merged.bundle.events), merged.bundle.study.setup);
    expect(fromBundle.n).toBe(17);
    expect(viaCli.n).toBe(fromBundle.n);
    expect(viaCli.estimate).toBe(fromBundle.estimate);
    expect(viaCli.lower).toBe(fromBundle.lower);
    expect(viaCli.upper).toBe(fromBundle.upper);
    expect(viaCli.verdict).toBe(fromBundle.verdict.status);
    // …and on the two files simply concatenated (order of entry does not change these figures)
    const cat = `${readFileSync(fixture('handover-counts-a.txt'), 'utf8')}${readFileSync(fixture('handover-counts-b.txt'), 'utf8')}`;
    const viaCat = JSON.parse(await run('assess', [write('cat.txt', cat), ...STUDY]));
    expect(viaCat.n).toBe(17);
    expect(viaCat.estimate).toBeCloseTo(48 / 17, 12); // hand sum: 34 + 14 = 48
    expect(Math.abs(viaCat.lower - fromBundle.lower!)).toBeLessThan(1e-12);
    expect(Math.abs(viaCat.upper - fromBundle.upper!)).toBeLessThan(1e-12);
  });
  it('reports shares on stderr text; merging again changes nothing; file order does not matter', async () => {
    expect(summary).toContain('phone-A: 12 counted (70.6 %)');
    expect(summary).toContain('phone-B: 5 counted (29.4 %)');
    expect((await mergeFiles([M, A])).out).toBe(out);
    expect((await mergeFiles([M, B])).out).toBe(out);
    expect((await mergeFiles([B, A])).out).toBe(out);
  });
  it('refuses a different study and a different setup', async () => {
    const other = write(
      'other.json',
      await run('bundle', [fixture('handover-counts-b.txt'), ...STUDY, '--device', 'x']),
    );
    await expect(mergeFiles([A, other])).rejects.toThrow(/refused: different studies/);
    const changed = write(
      'changed.json',
      await run('bundle', [
        fixture('handover-counts-b.txt'),
        ...STUDY,
        '--level',
        '0.9',
        ...OWN,
        '--device',
        'phone-C',
      ]),
    );
    await expect(mergeFiles([A, changed])).rejects.toThrow(/different setup.*level: 0\.95 vs 0\.9/);
    await expect(mergeFiles([A])).rejects.toThrow(/at least two/);
  });

  it('export csv is read back by Python csv', async () => {
    const csv = await run('export', ['--format', 'csv', M]);
    const rows: string[][] = JSON.parse(
      python(
        'import sys,csv,io,json; print(json.dumps(list(csv.reader(io.StringIO(sys.stdin.read(), newline="")))))',
        csv,
      ),
    );
    expect(rows).toHaveLength(18);
    const v = rows[0]!.indexOf('count_per_plot');
    expect(rows.slice(1).reduce((s, r) => s + Number(r[v]), 0)).toBe(48);
    expect((await run('export', ['--format', 'csv', '--dictionary', M])).split('\r\n')[0]).toBe(
      'column,type,unit,description,allowed_values',
    );
  });
  it('export dwc, geojson and report', async () => {
    expect((await run('export', ['--format', 'dwc', '--table', 'occurrence', M])).split('\r\n')).toHaveLength(
      19,
    );
    const both = await run('export', ['--format', 'dwc', M]);
    expect(both.startsWith('# event.csv\neventID,')).toBe(true);
    expect(both).toContain('\n# occurrence.csv\noccurrenceID,');
    expect(JSON.parse(await run('export', ['--format', 'geojson', M])).type).toBe('FeatureCollection');
    const html = await run('export', ['--format', 'report', M]);
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html).toContain(merged.bundle.checksum.value);
    // the method statement states the measured coverage of the rule (count cells of test/bench/coverage.md)
    expect(html).toContain(
      'Measured coverage of this rule: the reported interval covered the true value in 91.5–98.0 % of runs across the 36 count cells',
    );
    expect(html).toContain('test/bench/coverage.md, 2026-12-02, 10000 simulated studies per cell');
  });
  it('export refuses a damaged bundle, naming what and where', async () => {
    const damaged = out.replace('"value": 7', '"value": 8');
    expect(damaged).not.toBe(out);
    expect(await fails('export', ['--format', 'csv', write('damaged.json', damaged)])).toMatch(
      /damaged\.json: not a valid study bundle:\n {2}checksum\.value: does not match/,
    );
    const badTime = out.replace('"at": "2026-05-04T09:00:03+02:00"', '"at": "04/05/2026 09:00"');
    expect(await fails('export', ['--format', 'csv', write('time.json', badTime)])).toMatch(
      /events\[\d+\]\.at: not an ISO 8601 time/,
    );
    expect(
      await fails('export', [
        '--format',
        'dwc',
        write('lab.json', await run('bundle', [fixture('handover-lab.csv'), '--kind', 'measurement'])),
      ]),
    ).toMatch(/count studies/);
    expect(await fails('export', ['--format', 'pdf', M])).toMatch(/^flag --format/);
    expect(await fails('export', ['--format', 'csv', '--table', 'event', M])).toMatch(
      /--table goes with --format dwc/,
    );
  });
});
