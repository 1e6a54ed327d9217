/**
 * `sure-enough` end to end (the built command line, src/cli/README.md): a study bundle and its CSV export
 * read back by `assess` and `replay` from a file or standard input, for each data kind; the export's value
 * column names its data kind (count_per_plot, outcome_1_or_0), so --kind may be left out; a UTF-8 BOM and
 * CRLF are read (RFC 4180 §2); a bundle from a newer format version is refused naming both versions (exit
 * code 2, nothing on stdout), the current one (test/fixtures/bundle-format-v1.bundle.json) is read.
 * The figures' agreement with the phone is checked in test/surfaces/round-trip.test.ts; here the three
 * inputs must agree with each other and with the values typed in.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const bin = join(root, 'src', 'cli', 'bin.mjs');
const dir = mkdtempSync(join(tmpdir(), 'cli-round-trip-'));
const FIXTURE = join(root, 'test', 'fixtures', 'bundle-format-v1.bundle.json');

function run(args: string[], input = '') {
  const r = spawnSync(process.execPath, [bin, ...args], { input, encoding: 'utf8', cwd: root });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}
function ok(args: string[], input = ''): string {
  const r = run(args, input);
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  return r.stdout;
}
function write(name: string, text: string): string {
  const file = join(dir, name);
  writeFileSync(file, text);
  return file;
}

// Bortkiewicz (1898) horse-kick deaths per corps-year, a run of them (order not published); ZARR13
// (NIST/SEMATECH e-Handbook) heat flow meter values, the first twelve.
const zarr = (
  JSON.parse(readFileSync(join(root, 'test/fixtures/stats-zarr13.json'), 'utf8')).values as number[]
).slice(0, 12);
const kinds = [
  { kind: 'count', column: 'count_per_plot', values: [0, 1, 0, 2, 0, 1, 0, 1, 3, 0, 1, 2, 0, 4, 1] },
  { kind: 'pass-fail', column: 'outcome_1_or_0', values: zarr.map((v) => (v > 9.28 ? 1 : 0)) },
  { kind: 'measurement', column: 'value_W_per_m2K', values: zarr },
];

describe.each(kinds)('$kind: values → bundle → export → assess and replay', ({ kind, column, values }) => {
  const flags = ['--kind', kind, '--target', kind === 'count' ? 'precision:0.3' : 'margin:0.3', '--min', '5'];
  const typed = values.map(String).join('\n');
  const bundle = () =>
    ok(
      [
        'bundle',
        '-',
        ...flags,
        '--unit',
        'W/m2K',
        '--at',
        '2026-05-04T09:00:00Z',
        '--id',
        '0b5e8f0e-1c1d-4f6e-9a0b-2c3d4e5f6a7b',
      ],
      typed,
    );

  it('assess gives one answer for the values, the bundle (file and stdin) and its CSV export', () => {
    const b = write(`${kind}.bundle.json`, bundle());
    const csv = ok(['export', '--format', 'csv', b]);
    expect(csv.split('\r\n')[0]).toContain(`,${column},`);
    const figures = (out: string) => {
      const { setupFrom, input, ...rest } = JSON.parse(out);
      return rest;
    };
    const fromValues = figures(ok(['assess', '-', ...flags], typed));
    expect(fromValues.n).toBe(values.length);
    const fromBundle = JSON.parse(ok(['assess', b]));
    expect(fromBundle.setupFrom).toBe('bundle');
    expect(figures(JSON.stringify(fromBundle))).toEqual(fromValues);
    expect(figures(ok(['assess', '-'], readFileSync(b, 'utf8')))).toEqual(fromValues);
    expect(figures(ok(['assess', write(`${kind}.csv`, csv), ...flags]))).toEqual(fromValues);
    // with a byte-order mark, from standard input
    expect(figures(ok(['assess', '-', ...flags], `\uFEFF${csv}`))).toEqual(fromValues);
    // the export's column names the kind: --kind may be left out (not for a plain `value…` column)
    if (kind !== 'measurement')
      expect(figures(ok(['assess', '-', ...flags.slice(2)], csv))).toEqual(fromValues);
  });

  it('replay reads the bundle and the export as one sequence, as the JSON line of the same values', () => {
    const b = write(`${kind}-r.bundle.json`, bundle());
    const want = JSON.parse(ok(['replay', '-', ...flags], `${JSON.stringify({ values })}\n`));
    expect(JSON.parse(ok(['replay', b]))).toEqual({ ...want, setupFrom: 'bundle' });
    const csv = ok(['export', '--format', 'csv', b]);
    expect(JSON.parse(ok(['replay', '-', ...flags], csv))).toEqual({ ...want, setupFrom: 'flags' });
  });
});

describe('bundle format versions on the command line', () => {
  it('a newer version is refused naming both versions; exit 2, nothing on stdout', () => {
    const newer = readFileSync(FIXTURE, 'utf8').replace('"version": 1,', '"version": 2,');
    for (const args of [
      ['assess', '-'],
      ['replay', '-'],
      ['export', '--format', 'csv', '-'],
    ]) {
      const r = run(args, newer);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toMatch(
        /bundle format version 2, made by a newer version .* reads bundle format version 1/,
      );
    }
  });
  it('the current version (1, the first: no older one exists) is read as it is', () => {
    const out = JSON.parse(ok(['assess', FIXTURE]));
    expect(out.n).toBe(4);
    expect(out.setupFrom).toBe('bundle');
  });
});

describe('bad input through the one reader names its line', () => {
  it('an unclosed quote in a CSV export', () => {
    const r = run(['assess', '-', '--kind', 'count'], 'value,note\r\n1,ok\r\n2,"open\r\n3,x\r\n');
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe(
      'sure-enough: line 3: a quoted field is not closed (a " opens it and no " ends it)\n',
    );
  });
  it('a bundle changed after export', () => {
    const damaged = readFileSync(FIXTURE, 'utf8').replace('"value": 5.2', '"value": 5.3');
    const r = run(['assess', '-'], damaged);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(
      /standard input: not a valid study bundle:\n {2}checksum\.value: does not match/,
    );
  });
});
