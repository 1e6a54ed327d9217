/**
 * The hand-over commands end to end (in process: each command's run() gives stdout or throws the
 * UsageError that main.ts turns into exit code 2 with nothing on stdout).
 * Outside checks: Python's csv module reads the CSV export; `assess` on the union of both phones' values
 * gives the same summary as the merged bundle (the core assess is the reference the app also uses).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { assess } from '../../src/assess.ts';
import { pointsOf } from '../../src/bundle/events.ts';
import { parseBundle } from '../../src/bundle/validate.ts';
import { commands } from '../../src/cli/commands.ts';
import { parseArgs, UsageError } from '../../src/cli/io.ts';
import { mergeFiles } from '../../src/cli/merge.ts';

const dir = mkdtempSync(join(tmpdir(), 'handover-'));
const fixture = (name: string) => new URL(`../fixtures/${name}`, import.meta.url).pathname;
const ID = '0f8fad5b-d9cb-469f-a165-70867728950e';
const STUDY = ['--kind', 'count', '--target', 'precision:0.2', '--plot-area', '0.25'];
const OWN = ['--plot-area-unit', 'm2', '--taxon', 'Carex nigra', '--name', 'Sedge plots', '--id', ID];

function run(cmd: string, argv: string[]): string {
  return commands[cmd]!.run(parseArgs(argv));
}
function write(name: string, text: string): string {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
}
function fails(cmd: string, argv: string[]): string {
  try {
    run(cmd, argv);
  } catch (err) {
    expect(err).toBeInstanceOf(UsageError);
    return (err as Error).message;
  }
  throw new Error('expected a UsageError');
}

const A = write(
  'a.json',
  run('bundle', [
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
  run('bundle', [
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
  it('builds a valid bundle from values; the same input gives the same bundle', () => {
    const r = parseBundle(readFileSync(A, 'utf8'));
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
    const again = run('bundle', [
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
  it('a laboratory CSV with a non-detect', () => {
    const out = run('bundle', [
      fixture('handover-lab.csv'),
      '--kind',
      'measurement',
      '--unit',
      'mg/kg',
      '--at',
      '2026-05-06T14:00:00Z',
    ]);
    const r = parseBundle(out);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.bundle.events.map((e) => [e.value, e.censored ?? false])).toEqual([
      [12.5, false],
      [0.5, true],
      [301, false],
      [44.25, false],
    ]);
  });
  it('refuses bad flags and bad values, naming them', () => {
    expect(fails('bundle', [fixture('handover-counts-a.txt'), ...STUDY, '--id', 'not-a-uuid'])).toMatch(
      /^flag --id/,
    );
    expect(fails('bundle', [fixture('handover-counts-a.txt'), ...STUDY, '--at', '2026-05-04 09:00'])).toMatch(
      /^flag --at/,
    );
    expect(fails('bundle', [fixture('handover-lab.csv'), '--kind', 'count'])).toMatch(/line \d/);
    expect(fails('bundle', [fixture('handover-counts-a.txt'), ...STUDY, '--colour', 'red'])).toMatch(
      /unknown flag --colour/,
    );
  });
});

describe('merge', () => {
  const { out, summary } = mergeFiles([A, B]);
  const merged = parseBundle(out);
  if (!merged.ok) throw new Error(merged.problems.join('\n'));
  const M = write('m.json', out);

  it("gives the same summary as assess on the union of both phones' values", () => {
    const union = merged.bundle.events.map((e) => e.value).join('\n');
    const viaCli = JSON.parse(run('assess', [write('union.txt', union), ...STUDY]));
    const fromBundle = assess(pointsOf(merged.bundle.events), merged.bundle.study.setup);
    expect(fromBundle.n).toBe(17);
    expect(viaCli.n).toBe(fromBundle.n);
    expect(viaCli.estimate).toBe(fromBundle.estimate);
    expect(viaCli.lower).toBe(fromBundle.lower);
    expect(viaCli.upper).toBe(fromBundle.upper);
    expect(viaCli.verdict).toBe(fromBundle.verdict.status);
    // …and on the two files simply concatenated (order of entry does not change these figures)
    const cat = `${readFileSync(fixture('handover-counts-a.txt'), 'utf8')}${readFileSync(fixture('handover-counts-b.txt'), 'utf8')}`;
    const viaCat = JSON.parse(run('assess', [write('cat.txt', cat), ...STUDY]));
    expect(viaCat.n).toBe(17);
    expect(viaCat.estimate).toBeCloseTo(48 / 17, 12); // hand sum: 34 + 14 = 48
    expect(Math.abs(viaCat.lower - fromBundle.lower!)).toBeLessThan(1e-12);
    expect(Math.abs(viaCat.upper - fromBundle.upper!)).toBeLessThan(1e-12);
  });
  it('reports shares on stderr text; merging again changes nothing; file order does not matter', () => {
    expect(summary).toContain('phone-A: 12 counted (70.6 %)');
    expect(summary).toContain('phone-B: 5 counted (29.4 %)');
    expect(mergeFiles([M, A]).out).toBe(out);
    expect(mergeFiles([M, B]).out).toBe(out);
    expect(mergeFiles([B, A]).out).toBe(out);
  });
  it('refuses a different study and a different setup', () => {
    const other = write(
      'other.json',
      run('bundle', [fixture('handover-counts-b.txt'), ...STUDY, '--device', 'x']),
    );
    expect(() => mergeFiles([A, other])).toThrow(/refused: different studies/);
    const changed = write(
      'changed.json',
      run('bundle', [
        fixture('handover-counts-b.txt'),
        ...STUDY,
        '--level',
        '0.9',
        ...OWN,
        '--device',
        'phone-C',
      ]),
    );
    expect(() => mergeFiles([A, changed])).toThrow(/different setup.*level: 0\.95 vs 0\.9/);
    expect(() => mergeFiles([A])).toThrow(/at least two/);
  });

  it('export csv is read back by Python csv', () => {
    const csv = run('export', ['--format', 'csv', M]);
    const rows: string[][] = JSON.parse(
      execFileSync(
        'python3',
        [
          '-c',
          'import sys,csv,io,json; print(json.dumps(list(csv.reader(io.StringIO(sys.stdin.read(), newline="")))))',
        ],
        {
          input: csv,
          encoding: 'utf8',
        },
      ),
    );
    expect(rows).toHaveLength(18);
    const v = rows[0]!.indexOf('count_per_plot');
    expect(rows.slice(1).reduce((s, r) => s + Number(r[v]), 0)).toBe(48);
    expect(run('export', ['--format', 'csv', '--dictionary', M]).split('\r\n')[0]).toBe(
      'column,type,unit,description,allowed_values',
    );
  });
  it('export dwc, geojson and report', () => {
    expect(run('export', ['--format', 'dwc', '--table', 'occurrence', M]).split('\r\n')).toHaveLength(19);
    const both = run('export', ['--format', 'dwc', M]);
    expect(both.startsWith('# event.csv\neventID,')).toBe(true);
    expect(both).toContain('\n# occurrence.csv\noccurrenceID,');
    expect(JSON.parse(run('export', ['--format', 'geojson', M])).type).toBe('FeatureCollection');
    const html = run('export', ['--format', 'report', M]);
    expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
    expect(html).toContain(merged.bundle.checksum.value);
  });
  it('export refuses a damaged bundle, naming what and where', () => {
    const damaged = out.replace('"value": 7', '"value": 8');
    expect(damaged).not.toBe(out);
    expect(fails('export', ['--format', 'csv', write('damaged.json', damaged)])).toMatch(
      /damaged\.json: not a valid study bundle:\n {2}checksum\.value: does not match/,
    );
    const badTime = out.replace('"at": "2026-05-04T09:00:03+02:00"', '"at": "04/05/2026 09:00"');
    expect(fails('export', ['--format', 'csv', write('time.json', badTime)])).toMatch(
      /events\[\d+\]\.at: not an ISO 8601 time/,
    );
    expect(
      fails('export', [
        '--format',
        'dwc',
        write('lab.json', run('bundle', [fixture('handover-lab.csv'), '--kind', 'measurement'])),
      ]),
    ).toMatch(/count studies/);
    expect(fails('export', ['--format', 'pdf', M])).toMatch(/^flag --format/);
    expect(fails('export', ['--format', 'csv', '--table', 'event', M])).toMatch(
      /--table goes with --format dwc/,
    );
  });
});
