// `sure-enough assess` end to end: the built command (npm run build:cli), its JSON fields as in
// src/cli/README.md, and bad input → message on stderr naming the line or flag, exit code 2, nothing on stdout.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const bin = join(root, 'src', 'cli', 'bin.mjs');

function run(args: string[], input?: string) {
  const r = spawnSync(process.execPath, [bin, ...args], { input: input ?? '', encoding: 'utf8', cwd: root });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('assess output', () => {
  it('prints one JSON object with the fields of src/cli/README.md', () => {
    const values = '9.2\n9.3\n9,1\n9.5\n9.0\n9.4\n9.2\n9.3\n9.6\n9.1\n9.25\n9.35\n';
    const r = run(['assess', '--kind', 'measurement', '--target', 'margin:0.05', '--rule', 'naive'], values);
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    const out = JSON.parse(r.stdout);
    for (const k of [
      'kind',
      'n',
      'estimate',
      'lower',
      'upper',
      'level',
      'sided',
      'method',
      'verdict',
      'reason',
      'more',
    ])
      expect(out).toHaveProperty(k);
    expect(out).toMatchObject({
      kind: 'measurement',
      n: 12,
      level: 0.95,
      sided: 'two',
      method: 't',
      verdict: 'keep going',
    });
    expect(out.estimate).toBeCloseTo(9.275, 12);
    expect(out.more.likely).toBeGreaterThan(0);
    expect(r.stdout.trim().split('\n')).toHaveLength(1);
  });
  it('reads a CSV file and pass-fail with a lot', () => {
    const dir = mkdtempSync(join(tmpdir(), 'se-'));
    const f = join(dir, 'items.csv');
    writeFileSync(f, `item,value\n${Array.from({ length: 50 }, (_, i) => `${i},0`).join('\n')}\n`);
    const r = run(['assess', f, '--kind', 'pass-fail', '--population', '500', '--sided', 'upper']);
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.method).toBe('hypergeometric');
    expect(out.upper).toBeCloseTo(27 / 500, 12); // exact hypergeometric bound: N = 500, n = 50, x = 0 → D_U = 27 [derived]
    expect(out.more).toBeNull();
  });
  it('help documents every study flag', () => {
    const r = run(['help', 'assess']);
    expect(r.code).toBe(0);
    for (const flag of [
      '--kind',
      '--level',
      '--sided',
      '--method',
      '--target',
      '--rule',
      '--min',
      '--population',
      '--plot-area',
      '--nb-k',
      '--taylor-a',
      '--taylor-b',
      '--max',
    ])
      expect(r.stdout).toContain(flag);
  });
});

describe('bad input: message, exit code 2, nothing on stdout', () => {
  it.each([
    [['assess', '--kind', 'measurement'], '1\n2\nabc\n', 'line 3: "abc" is not a number'],
    [['assess', '--kind', 'count'], '1\n-2\n', 'line 2: "-2" is negative'],
    [['assess', '--kind', 'count'], '1\n2.5\n', 'line 2: "2.5" is not a whole number'],
    [['assess', '--kind', 'pass-fail'], '0\n1\n2\n', 'line 3: "2" is not 0 or 1'],
    [
      ['assess', '--kind', 'measurement', '--level', '1.2'],
      '1\n2\n',
      'flag --level: must be strictly between 0 and 1',
    ],
    [['assess', '--kind', 'measurement', '--level', '0'], '1\n2\n', 'flag --level'],
    [['assess', '--kind', 'measurement'], '', 'the input holds no values'],
    [['assess', '--kind', 'measurement'], '# only a comment\n', 'the input holds no values'],
    [['assess', '--kind', 'measurement', '--colour', 'red'], '1\n', 'unknown flag --colour'],
    [['assess', '--kind', 'fish'], '1\n', 'flag --kind: must be measurement, count or pass-fail, got "fish"'],
    [['assess'], '1\n', 'flag --kind: missing (measurement, count or pass-fail)'],
    [['assess', '--frobnicate', '3'], '1\n', 'unknown flag --frobnicate'],
    [['assess', '--kind'], '1\n', 'flag --kind needs a value'],
    [['assess', '--kind', 'count', '--kind', 'count'], '1\n', 'flag --kind given twice'],
    [
      ['assess', '--kind', 'count', '--method', 'wilson'],
      '1\n',
      'flag --method: must be t, poisson-exact or quasi-poisson for count data, got "wilson"',
    ],
    [['assess', '--kind', 'measurement', '--target', 'width:3'], '1\n', 'flag --target'],
    [['assess', '--kind', 'measurement', '--population', '2'], '1\n2\n3\n', 'flag --population'],
    [['assess', 'no-such-file.txt', '--kind', 'measurement'], '', 'cannot read no-such-file.txt'],
  ])('%j', (args, input, message) => {
    const r = run(args as string[], input as string);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain(message);
  });
});
