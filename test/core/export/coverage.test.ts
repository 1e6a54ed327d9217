/**
 * The coverage figures the report states (src/export/coverage.ts) must be those of the coverage benchmark's
 * output, test/bench/coverage.md (written by `npm run bench:coverage -- --out test/bench/coverage.md`).
 * This test reads that file, summarises it the way coverage.ts documents (per rule and data kind: lowest
 * and highest coverage over the grid cells; per data kind: the largest SPRT error rates) and fails when the
 * hand-transcribed table disagrees. Evidence: derived (from the benchmark's own printed table).
 * When the file does not exist yet, the comparison is skipped (its name says so) and coverage.ts must be
 * empty, so the report says "not yet measured".
 */
import { existsSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  COVERAGE_SOURCE,
  type CoverageFigure,
  coverageStatement,
  GRID_WORDS,
  MEASURED_COVERAGE,
  SPRT_ERROR_RATES,
  type SprtFigure,
} from '../../../src/export/coverage.ts';
import type { DataKind } from '../../../src/model/types.ts';

const FILE = new URL('../../bench/coverage.md', import.meta.url);
const EXISTS = existsSync(FILE);

function kindOfCell(name: string): DataKind | null {
  if (/^(normal|lognormal)\b/i.test(name)) return 'measurement';
  if (/^(Poisson|NB)\b/.test(name)) return 'count';
  if (/^Bernoulli\b/.test(name)) return 'pass-fail';
  return null;
}

function kindOfSprtRow(name: string): DataKind | null {
  if (/^pass\/fail/i.test(name)) return 'pass-fail';
  if (/counts/i.test(name)) return 'count';
  if (/^(lognormal|normal)/i.test(name)) return 'measurement';
  return null;
}

interface Parsed {
  date: string | null;
  replicates: number | null;
  coverage: CoverageFigure[];
  sprt: SprtFigure[];
  /** n* values of the grid cells per data kind. */
  sizes: Map<DataKind, Set<number>>;
}

/** Table cells of a markdown row (escaped pipes `\|` kept inside a cell). */
function cells(line: string): string[] {
  return line
    .trim()
    .replace(/^\||\|$/g, '')
    .split(/(?<!\\)\|/)
    .map((c) => c.trim());
}

/** Reads the benchmark's markdown output (format of test/bench/coverage-bench.ts). */
function parseBench(md: string): Parsed {
  const date = /Date: (\d{4}-\d{2}-\d{2})/.exec(md)?.[1] ?? null;
  const r = /R = (\d+) replicates per cell/.exec(md)?.[1];
  const lines = md.split(/\r?\n/);
  const cov = new Map<string, number[]>();
  const sprt = new Map<DataKind, { above: number[]; below: number[]; alpha: number; beta: number }>();
  const sizes = new Map<DataKind, Set<number>>();
  let table: 'grid' | 'sprt' | null = null;
  for (const line of lines) {
    if (!line.trim().startsWith('|')) {
      table = null;
      continue;
    }
    const c = cells(line);
    if (c[0] === 'cell' && c[2] === 'rule') {
      table = 'grid';
      continue;
    }
    if (c[0] === 'data' && /zone/.test(c[1] ?? '')) {
      table = 'sprt';
      continue;
    }
    if (/^-+$/.test(c[0] ?? '') || table === null) continue;
    if (table === 'grid') {
      const kind = kindOfCell(c[0]!);
      const rule = c[2]!;
      if (kind === null || !['naive', 'standard', 'strict'].includes(rule)) continue;
      const m = /^([\d.]+) ±/.exec(c[3]!);
      if (!m) throw new Error(`coverage.md: cannot read the coverage cell "${c[3]}" in: ${line}`);
      sizes.set(kind, (sizes.get(kind) ?? new Set()).add(Number(c[1])));
      const key = `${rule}/${kind}`;
      cov.set(key, [...(cov.get(key) ?? []), Number(m[1])]);
    } else {
      const kind = kindOfSprtRow(c[0]!);
      if (kind === null) throw new Error(`coverage.md: unknown SPRT data row: ${line}`);
      const [alpha, beta] = c[2]!.split(',').map((x) => Number(x.trim()) * 100) as [number, number];
      const above = Number(/^([\d.]+) %/.exec(c[3]!)?.[1]);
      const below = Number(/^([\d.]+) %/.exec(c[4]!)?.[1]);
      const s = sprt.get(kind) ?? { above: [], below: [], alpha, beta };
      s.above.push(above);
      s.below.push(below);
      sprt.set(kind, s);
    }
  }
  const coverage: CoverageFigure[] = [...cov].map(([key, xs]) => {
    const [rule, kind] = key.split('/') as [CoverageFigure['rule'], DataKind];
    return { rule, kind, cells: xs.length, minPercent: Math.min(...xs), maxPercent: Math.max(...xs) };
  });
  const sprtFigures: SprtFigure[] = [...sprt].map(([kind, s]) => ({
    kind,
    rows: s.above.length,
    wrongAbovePercent: Math.max(...s.above),
    wrongBelowPercent: Math.max(...s.below),
    alphaPercent: Math.round(s.alpha * 1e6) / 1e6,
    betaPercent: Math.round(s.beta * 1e6) / 1e6,
  }));
  return { date, replicates: r === undefined ? null : Number(r), coverage, sprt: sprtFigures, sizes };
}

const byKey = <T extends { kind: string; rule?: string }>(xs: readonly T[]) =>
  [...xs].sort((a, b) => `${a.rule ?? ''}/${a.kind}`.localeCompare(`${b.rule ?? ''}/${b.kind}`));

describe('coverage figures of the report', () => {
  it('the parser reads the benchmark format (a sample in its layout; the check can fail)', () => {
    const sample = [
      '# Coverage benchmark of the stopping rules',
      '',
      'Date: 2026-01-02. Command: `npm run bench:coverage -- --out test/bench/coverage.md`.',
      'Settings: nominal level 0.95 two-sided, R = 2000 replicates per cell, minimum m = 10, cap 10·n*, common random',
      '',
      '| cell | n* | rule | coverage ± MC | mean n/n* | n p10/p50/p90 | at min | capped | goal |',
      '|---|---|---|---|---|---|---|---|---|',
      '| normal μ=10 σ=1 | 25 | naive | 88.0 ± 1.4 | 0.90 | 12/22/36 | 3.0 % | 0.0 % |  |',
      '| normal μ=10 σ=1 | 25 | standard | 94.6 ± 1.0 | 1.10 | 15/27/41 | 0.0 % | 0.0 % | PASS |',
      '| lognormal CV 1 | 25 | standard | 93.9 ± 1.1 | 1.20 | 15/27/41 | 0.0 % | 0.0 % | within MC |',
      '| lognormal CV 1 | 25 | standard t (raw) | 80.0 ± 1.8 | 1.00 | 15/27/41 | 0.0 % | 0.0 % |  |',
      '| Poisson λ=2 | 25 | standard | 95.2 ± 0.9 | 1.00 | 15/27/41 | 0.0 % | 0.0 % | PASS |',
      '| Bernoulli p=0.1 | 100 | strict | 97.0 ± 0.7 | 1.40 | 15/27/41 | 0.0 % | 0.0 % | PASS |',
      '',
      '### Limit decision (Wald SPRT): realised error rates at the ends of the indifference zone',
      '',
      '| data | zone θ₀ – θ₁ | α, β | P(above \\| θ₀) | P(below \\| θ₁) | mean n at θ₀ / θ₁ | Wald ASN θ₀ / θ₁ | truncated at | goal |',
      '|---|---|---|---|---|---|---|---|---|',
      '| Poisson counts | 1.5 – 2.5 | 0.05, 0.10 | 3.10 % | 7.00 % | 20.0 / 21.0 | 19.0 / 20.0 | 90 | PASS |',
      '| NB counts k=2 (k given) | 1.5 – 2.5 | 0.05, 0.10 | 4.20 % | 6.50 % | 40.0 / 41.0 | 39.0 / 40.0 | 180 | PASS |',
      '',
    ].join('\n');
    const p = parseBench(sample);
    expect(p.date).toBe('2026-01-02');
    expect(p.replicates).toBe(2000);
    expect(byKey(p.coverage)).toEqual(
      byKey([
        { rule: 'naive', kind: 'measurement', cells: 1, minPercent: 88, maxPercent: 88 },
        { rule: 'standard', kind: 'measurement', cells: 2, minPercent: 93.9, maxPercent: 94.6 },
        { rule: 'standard', kind: 'count', cells: 1, minPercent: 95.2, maxPercent: 95.2 },
        { rule: 'strict', kind: 'pass-fail', cells: 1, minPercent: 97, maxPercent: 97 },
      ]),
    );
    expect(p.sprt).toEqual([
      {
        kind: 'count',
        rows: 2,
        wrongAbovePercent: 4.2,
        wrongBelowPercent: 7,
        alphaPercent: 5,
        betaPercent: 10,
      },
    ]);
  });

  it.skipIf(!EXISTS)(
    `coverage.ts agrees with test/bench/coverage.md${EXISTS ? '' : ' (SKIPPED: test/bench/coverage.md does not exist yet; run `npm run bench:coverage -- --out test/bench/coverage.md`)'}`,
    () => {
      const p = parseBench(readFileSync(FILE, 'utf8'));
      expect(p.coverage.length, 'the benchmark file holds no grid rows this test can read').toBeGreaterThan(
        0,
      );
      expect(COVERAGE_SOURCE.date).toBe(p.date);
      expect(COVERAGE_SOURCE.replicatesPerCell).toBe(p.replicates);
      expect(byKey(MEASURED_COVERAGE)).toEqual(byKey(p.coverage));
      expect(byKey(SPRT_ERROR_RATES)).toEqual(byKey(p.sprt));
      // the cells' target sizes n* named in the statement's words
      for (const [kind, sizes] of p.sizes) {
        const [a, b] = [...sizes].sort((x, y) => x - y);
        expect(GRID_WORDS[kind]).toContain(`about ${a} and ${b} entries`);
      }
    },
  );

  it.skipIf(EXISTS)(
    'without the benchmark file, no figure is claimed: the report says "not yet measured"',
    () => {
      expect(MEASURED_COVERAGE).toHaveLength(0);
      expect(SPRT_ERROR_RATES).toHaveLength(0);
      expect(coverageStatement({ rule: 'standard', kind: 'measurement' })).toBeNull();
    },
  );

  it('each transcribed figure becomes a statement naming the benchmark file and date', () => {
    for (const f of MEASURED_COVERAGE) {
      const s = coverageStatement(f);
      expect(s).toContain(`${f.minPercent}`);
      expect(s).toContain(COVERAGE_SOURCE.file);
      expect(s).toContain(String(COVERAGE_SOURCE.date));
    }
    for (const f of SPRT_ERROR_RATES) {
      const s = coverageStatement({ rule: 'sprt', kind: f.kind });
      expect(s).toContain(`${f.wrongAbovePercent} %`);
      expect(s).toContain(String(COVERAGE_SOURCE.date));
    }
  });
});
