// Field-design input on the command line: `value,stratum[,cluster]` lines, CSV stratum/cluster columns,
// `<RL` non-detects, and the --strata / --cost / --design / --non-detects flags (src/cli/help.ts documents
// them). Parsers only: the statistics behind them are checked in the estimator tests.
import { describe, expect, it } from 'vitest';
import { UsageError } from '../../../src/cli/io.ts';
import { parseStudyFlags } from '../../../src/cli/study-flags.ts';
import { parseValues } from '../../../src/validate/parse-values.ts';

const flags = (o: Record<string, string>) => new Map(Object.entries(o));

describe('parseValues — design columns', () => {
  it('reads value,stratum and value,stratum,cluster lines; keeps 4,2 as 4.2', () => {
    const r = parseValues('12,woodland\n15,woodland,T3\n7,,T4\n4,2\n<0.5,meadow\n', 'measurement');
    if (!r.ok) throw new Error(r.errors.join());
    expect(r.points).toEqual([
      { value: 12, stratum: 'woodland' },
      { value: 15, stratum: 'woodland', cluster: 'T3' },
      { value: 7, cluster: 'T4' },
      { value: 4.2 },
      { value: 0.5, censored: true, stratum: 'meadow' },
    ]);
  });
  it('reads stratum and cluster columns of a CSV', () => {
    const r = parseValues('cluster,value,stratum\nT1,3,wet\nT2,5,\n', 'count');
    if (!r.ok) throw new Error(r.errors.join());
    expect(r.points).toEqual([
      { value: 3, stratum: 'wet', cluster: 'T1' },
      { value: 5, cluster: 'T2' },
    ]);
  });
  it('still names bad lines', () => {
    const r = parseValues('12,woodland\nabc,meadow\n', 'measurement');
    expect(r.ok).toBe(false);
    expect(!r.ok && r.errors[0]).toMatch(/^line 2: /);
  });
});

describe('parseStudyFlags — design flags', () => {
  it('--strata and --cost', () => {
    const s = parseStudyFlags(
      flags({ kind: 'measurement', strata: 'woodland:0.6,meadow:0.4', cost: 'meadow:2' }),
    );
    expect(s.strata).toEqual([
      { name: 'woodland', weight: 0.6 },
      { name: 'meadow', weight: 0.4, cost: 2 },
    ]);
  });
  it('--design composite and --non-detects', () => {
    const s = parseStudyFlags(
      flags({ kind: 'measurement', design: 'composite', 'non-detects': 'half-limit' }),
    );
    expect([s.design, s.nonDetects]).toEqual(['composite', 'half-limit']);
  });
  it('refuses bad values, naming the flag', () => {
    expect(() => parseStudyFlags(flags({ kind: 'measurement', cost: 'a:1' }))).toThrow(
      /--cost needs --strata/,
    );
    expect(() => parseStudyFlags(flags({ kind: 'measurement', strata: 'a' }))).toThrow(UsageError);
    expect(() => parseStudyFlags(flags({ kind: 'measurement', design: 'grid' }))).toThrow(/--design/);
    expect(() => parseStudyFlags(flags({ kind: 'count', 'non-detects': 'half-limit' }))).toThrow(
      /measurements only/,
    );
  });
});
