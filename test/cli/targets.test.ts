// Relative targets are written one way everywhere: `relative:20%` and `relative:0.2` both mean ±20 % of the
// estimate; a bare number above 1 is refused with a message that shows both readings (a fraction as stored,
// a percentage as people say it). The values are NIST/SEMATECH ZARR13 heat-flow data (test/fixtures).
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { commands } from '../../src/cli/commands.ts';
import { parseArgs, UsageError } from '../../src/cli/io.ts';
import { assertSetup } from '../../src/model/setup.ts';
import zarr13 from '../fixtures/stats-zarr13.json';

const values = `${(zarr13.values as number[]).slice(0, 30).join('\n')}\n`;
const passFail = `${(zarr13.values as number[])
  .slice(0, 60)
  .map((v) => (v > 9.26 ? 1 : 0))
  .join('\n')}\n`;

const dir = mkdtempSync(join(tmpdir(), 'targets-'));

/** `sure-enough assess` in process: stdout, or the UsageError message the command line prints with exit 2. */
async function run(args: string[], input: string) {
  const file = join(dir, `in-${Math.random().toString(36).slice(2)}.txt`);
  writeFileSync(file, input);
  const assess = commands.assess!;
  try {
    return {
      code: 0,
      stdout: await assess.run(parseArgs([file, ...args], assess.flags, 'assess')),
      stderr: '',
    };
  } catch (err) {
    if (!(err instanceof UsageError)) throw err;
    return { code: 2, stdout: '', stderr: err.message };
  }
}

describe('relative targets', () => {
  it('relative:20% and relative:0.2 give the same answer', async () => {
    const a = await run(['--kind', 'measurement', '--target', 'relative:20%'], values);
    const b = await run(['--kind', 'measurement', '--target', 'relative:0.2'], values);
    expect(a.code).toBe(0);
    expect(a.stdout).toBe(b.stdout);
  });
  it('a bare number above 1 is refused, naming both readings, on the command line and in the core', async () => {
    const r = await run(['--kind', 'measurement', '--target', 'relative:20'], values);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    const words =
      'a relative target is a fraction of the estimate: 20 would mean ±2000 %; for ±20 % write 0.2 (or 20% on the command line)';
    expect(r.stderr).toContain(`flag --target: ${words}`);
    expect(() =>
      assertSetup({
        kind: 'measurement',
        level: 0.95,
        sided: 'two',
        rule: 'standard',
        min: 10,
        target: { kind: 'relative', value: 20 },
      }),
    ).toThrow(`target.value: ${words}`);
  });
  it('a pass/fail limit may be written in percent; a measurement margin may not', async () => {
    const a = await run(['--kind', 'pass-fail', '--target', 'limit:60%'], passFail);
    const b = await run(['--kind', 'pass-fail', '--target', 'limit:0.6'], passFail);
    expect(a.code).toBe(0);
    expect(a.stdout).toBe(b.stdout);
    const c = await run(['--kind', 'measurement', '--target', 'margin:5%'], values);
    expect(c.code).toBe(2);
    expect(c.stderr).toContain('a percent sign is read only for relative targets and pass/fail proportions');
  });
});
