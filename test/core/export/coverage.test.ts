/**
 * The coverage figures the report states (src/export/coverage.ts) come from the coverage benchmark's run as
 * numbers, src/export/coverage.json (written by `npm run bench:coverage -- --json …` in the same run as the
 * table). No Markdown is read.
 *
 * Checked: the run is well formed (each row a benchmark row: its kind, finite percentages, ordered
 * percentiles); the report's summary is the extremes of the rows of exactly that rule and kind, counted
 * here by a plain loop; and a few figures of the run of 2026-12-02 as printed in test/bench/coverage.md
 * (read from its main and SPRT tables by a line filter on the "standard" rows: standard rule 73.9–97.6 % over 89
 * measurement cells, 91.5–98.0 % over 36 count cells, 91.5–98.9 % over 34 pass/fail cells; SPRT at most
 * 1.68 % / 4.13 % over the 2 count rows) so a run whose JSON lost or shifted a row fails. Evidence: read (the benchmark's
 * printed table) and derived (the summaries).
 */
import { describe, expect, it } from 'vitest';
import {
  COVERAGE_RUN,
  COVERAGE_SOURCE,
  coverageStatement,
  GRID_WORDS,
  MEASURED_COVERAGE,
  SPRT_ERROR_RATES,
} from '../../../src/export/coverage.ts';
import type { DataKind } from '../../../src/model/types.ts';

const KINDS: DataKind[] = ['measurement', 'count', 'pass-fail'];
const isPercent = (x: unknown) => typeof x === 'number' && Number.isFinite(x) && x >= 0 && x <= 100;

describe('the benchmark run (src/export/coverage.json)', () => {
  it('is a run: date, settings, grid rows and SPRT rows of the documented shape', () => {
    expect(COVERAGE_RUN.date).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(COVERAGE_RUN.settings.level).toBe(0.95);
    expect(COVERAGE_RUN.settings.replicatesPerCell).toBeGreaterThanOrEqual(1000);
    expect(COVERAGE_RUN.grid.length).toBeGreaterThan(0);
    for (const r of COVERAGE_RUN.grid) {
      expect(KINDS).toContain(r.kind);
      expect(r.rule.trim()).not.toBe('');
      for (const p of [r.coveragePercent, r.mcMarginPercent, r.atMinPercent, r.cappedPercent])
        expect(isPercent(p), `${r.cell} ${r.rule}`).toBe(true);
      expect(r.nP10).toBeLessThanOrEqual(r.nP50);
      expect(r.nP50).toBeLessThanOrEqual(r.nP90);
      expect(r.meanNOverNStar).toBeGreaterThan(0);
      expect(['', 'PASS', 'within MC', 'SHORT', 'n/a']).toContain(r.goal);
    }
    for (const r of COVERAGE_RUN.sprt) {
      expect(KINDS).toContain(r.kind);
      expect(r.theta0).toBeLessThan(r.theta1);
      expect(isPercent(r.wrongAbovePercent) && isPercent(r.wrongBelowPercent)).toBe(true);
    }
  });

  it('holds the figures printed in test/bench/coverage.md for the run of 2026-12-02', () => {
    expect(COVERAGE_SOURCE).toEqual({
      file: 'test/bench/coverage.md',
      date: '2026-12-02',
      nominalPercent: 95,
      replicatesPerCell: 10000,
    });
    const standard = (kind: DataKind) =>
      MEASURED_COVERAGE.find((f) => f.rule === 'standard' && f.kind === kind);
    expect(standard('measurement')).toEqual({
      rule: 'standard',
      kind: 'measurement',
      cells: 89,
      minPercent: 73.9,
      maxPercent: 97.6,
    });
    expect(standard('count')).toEqual({
      rule: 'standard',
      kind: 'count',
      cells: 36,
      minPercent: 91.5,
      maxPercent: 98,
    });
    expect(standard('pass-fail')).toEqual({
      rule: 'standard',
      kind: 'pass-fail',
      cells: 34,
      minPercent: 91.5,
      maxPercent: 98.9,
    });
    expect(SPRT_ERROR_RATES.find((f) => f.kind === 'count')).toEqual({
      kind: 'count',
      rows: 2,
      wrongAbovePercent: 1.68,
      wrongBelowPercent: 4.13,
      alphaPercent: 5,
      betaPercent: 10,
    });
  });
});

describe('the report summary', () => {
  it('is the lowest and highest coverage over the rows of exactly that rule and kind', () => {
    for (const rule of ['naive', 'standard', 'strict'] as const)
      for (const kind of KINDS) {
        let lo = Number.POSITIVE_INFINITY;
        let hi = Number.NEGATIVE_INFINITY;
        let n = 0;
        for (const r of COVERAGE_RUN.grid)
          if (r.rule === rule && r.kind === kind) {
            n++;
            if (r.coveragePercent < lo) lo = r.coveragePercent;
            if (r.coveragePercent > hi) hi = r.coveragePercent;
          }
        const f = MEASURED_COVERAGE.find((x) => x.rule === rule && x.kind === kind);
        if (n === 0) expect(f).toBeUndefined();
        else expect(f).toEqual({ rule, kind, cells: n, minPercent: lo, maxPercent: hi });
      }
  });

  it('each figure becomes a statement naming the benchmark table, date and n*', () => {
    for (const f of MEASURED_COVERAGE) {
      const s = coverageStatement(f);
      expect(s).toContain(`${f.minPercent.toFixed(1)}`);
      expect(s).toContain(COVERAGE_SOURCE.file);
      expect(s).toContain(String(COVERAGE_SOURCE.date));
    }
    for (const f of SPRT_ERROR_RATES) {
      const s = coverageStatement({ rule: 'sprt', kind: f.kind });
      expect(s).toContain(`${f.wrongAbovePercent} %`);
      expect(s).toContain(String(COVERAGE_SOURCE.date));
    }
    for (const kind of KINDS) {
      const sizes = [...new Set(COVERAGE_RUN.grid.filter((r) => r.kind === kind).map((r) => r.nStar))];
      for (const n of sizes) expect(GRID_WORDS[kind]).toContain(String(n));
    }
  });
});
