// `sure-enough replay` end to end (src/cli/README.md, "Output"): JSON lines in, one JSON line out per sequence, and bad
// input → a message on stderr naming the line, exit code 2, nothing on stdout.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const root = join(import.meta.dirname, '..', '..');
const bin = join(root, 'src', 'cli', 'bin.mjs');

function run(args: string[], input: string) {
  const r = spawnSync(process.execPath, [bin, 'replay', ...args], { input, encoding: 'utf8', cwd: root });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

const steady = Array.from({ length: 60 }, (_, i) => 10 + ((i * 7) % 11) / 10 - 0.5);

describe('replay output', () => {
  it('one line per input sequence with stoppedAt, estimate, lower, upper, verdict', () => {
    const input = `${JSON.stringify({ values: steady })}\n\n# a comment\n${JSON.stringify({ values: steady.slice(0, 5) })}\n`;
    const r = run(['--kind', 'measurement', '--target', 'margin:0.2'], input);
    expect(r.code).toBe(0);
    const lines = r.stdout
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
    expect(lines).toHaveLength(2);
    expect(Object.keys(lines[0])).toEqual(['stoppedAt', 'estimate', 'lower', 'upper', 'verdict']);
    expect(lines[0].stoppedAt).toBeGreaterThanOrEqual(10);
    expect(lines[0].verdict).toBe('enough');
    expect(lines[0].upper - lines[0].lower).toBeLessThanOrEqual(0.4 + 1e-12);
    // five values never reach the minimum of 10
    expect(lines[1].stoppedAt).toBeNull();
    expect(lines[1].verdict).toBe('keep going');
  });
  it('the strict rule stops later than the naive one on the same sequence', () => {
    const input = `${JSON.stringify({ values: steady })}\n`;
    const naive = JSON.parse(
      // a hot-spot share of 50 % (5 entries) leaves the minimum at 10, so the two rules can differ
      run(
        ['--kind', 'measurement', '--target', 'margin:0.2', '--rule', 'naive', '--hot-spot-share', '0.5'],
        input,
      ).stdout,
    );
    const strict = JSON.parse(
      run(
        ['--kind', 'measurement', '--target', 'margin:0.2', '--rule', 'strict', '--hot-spot-share', '0.5'],
        input,
      ).stdout,
    );
    expect(strict.stoppedAt).toBeGreaterThan(naive.stoppedAt);
  });
  it('pass-fail limit decision by SPRT', () => {
    const values = new Array(200).fill(0);
    const r = run(
      [
        '--kind',
        'pass-fail',
        '--rule',
        'sprt',
        '--target',
        'limit:0.05',
        '--sprt-lower',
        '0.02',
        '--sprt-upper',
        '0.08',
      ],
      `${JSON.stringify({ values })}\n`,
    );
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).verdict).toBe('below limit');
  });
});

describe('replay bad input: exit 2, the line named, nothing on stdout', () => {
  const cases: [string, string[], string, RegExp][] = [
    ['not JSON', ['--kind', 'measurement'], '{"values":[1,2]}\n{"values":[1,2\n', /line 2/],
    ['no values field', ['--kind', 'measurement'], '{"values":[1]}\n\n{"vals":[1]}\n', /line 3/],
    ['a string value', ['--kind', 'measurement'], '{"values":[1,"x"]}\n', /line 1, value 2/],
    ['a fractional count', ['--kind', 'count'], '{"values":[1,2]}\n{"values":[1,2.5]}\n', /line 2, value 2/],
    ['a pass-fail 2', ['--kind', 'pass-fail'], '{"values":[0,1,2]}\n', /line 1, value 3/],
    ['empty input', ['--kind', 'count'], '\n', /no sequences/],
    ['unknown rule', ['--kind', 'count', '--rule', 'fast'], '{"values":[1]}\n', /--rule/],
  ];
  for (const [name, args, input, pattern] of cases)
    it(name, () => {
      const r = run(args, input);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr).toMatch(pattern);
    });
});
