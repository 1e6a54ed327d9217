/**
 * The stopping rules' measured coverage, for the report's method statement.
 *
 * Source: this project's coverage benchmark, test/bench/coverage.md (written by
 * `npm run bench:coverage -- --out test/bench/coverage.md`; its grid and settings are stated there). The
 * figures below are transcribed from that file by hand; COVERAGE_SOURCE names its date and settings, and
 * test/core/export/coverage.test.ts re-reads the file and fails when a figure here disagrees with it.
 * A rule or data kind without a figure gives null, and the report then says "not yet measured".
 *
 * Summary per rule and data kind: the lowest and highest realised coverage (percent, as the benchmark
 * prints it, one decimal) over the grid cells of that kind whose rule column is exactly the rule's name
 * (measurement: normal and lognormal cells; count: Poisson and negative binomial; pass-fail: Bernoulli).
 * The SPRT is summarised by its realised error rates at the two ends of the indifference zone (largest
 * over the benchmark's rows of that data kind).
 */
import type { DataKind, RuleName } from '../model/types.ts';

export interface CoverageFigure {
  rule: Exclude<RuleName, 'sprt'>;
  kind: DataKind;
  /** Grid cells of this kind in the benchmark's main table. */
  cells: number;
  /** Lowest and highest realised coverage over those cells, in percent. */
  minPercent: number;
  maxPercent: number;
}

export interface SprtFigure {
  kind: DataKind;
  /** Benchmark rows of this kind (data distributions). */
  rows: number;
  /** Largest realised rate of "above limit" at the lower end θ₀, and of "below limit" at θ₁, in percent. */
  wrongAbovePercent: number;
  wrongBelowPercent: number;
  /** The error rates the benchmark asked for (α at θ₀, β at θ₁), in percent. */
  alphaPercent: number;
  betaPercent: number;
}

/** Which benchmark run the figures come from (null date: not yet transcribed). Transcribed 2026-12-01. */
export const COVERAGE_SOURCE: {
  file: string;
  date: string | null;
  nominalPercent: number;
  replicatesPerCell: number | null;
} = {
  file: 'test/bench/coverage.md',
  date: '2026-12-01',
  nominalPercent: 95,
  replicatesPerCell: 10000,
};

/** From test/bench/coverage.md of 2026-12-01 (R = 10,000 per cell), main table. */
export const MEASURED_COVERAGE: readonly CoverageFigure[] = [
  { rule: 'naive', kind: 'measurement', cells: 8, minPercent: 91.3, maxPercent: 94.5 },
  { rule: 'standard', kind: 'measurement', cells: 8, minPercent: 93.7, maxPercent: 96.1 },
  { rule: 'strict', kind: 'measurement', cells: 8, minPercent: 91.0, maxPercent: 95.0 },
  { rule: 'naive', kind: 'count', cells: 6, minPercent: 89.2, maxPercent: 95.6 },
  { rule: 'standard', kind: 'count', cells: 6, minPercent: 92.7, maxPercent: 96.2 },
  { rule: 'strict', kind: 'count', cells: 6, minPercent: 87.2, maxPercent: 95.7 },
  { rule: 'naive', kind: 'pass-fail', cells: 6, minPercent: 93.8, maxPercent: 97.6 },
  { rule: 'standard', kind: 'pass-fail', cells: 6, minPercent: 94.9, maxPercent: 97.7 },
  { rule: 'strict', kind: 'pass-fail', cells: 6, minPercent: 99.9, maxPercent: 100.0 },
];

/** From test/bench/coverage.md of 2026-12-01, "Limit decision (Wald SPRT)" table. */
export const SPRT_ERROR_RATES: readonly SprtFigure[] = [
  {
    kind: 'pass-fail',
    rows: 1,
    wrongAbovePercent: 3.25,
    wrongBelowPercent: 9.97,
    alphaPercent: 5,
    betaPercent: 10,
  },
  {
    kind: 'count',
    rows: 2,
    wrongAbovePercent: 2.93,
    wrongBelowPercent: 7.79,
    alphaPercent: 5,
    betaPercent: 10,
  },
  {
    kind: 'measurement',
    rows: 1,
    wrongAbovePercent: 1.69,
    wrongBelowPercent: 10.69,
    alphaPercent: 5,
    betaPercent: 10,
  },
];

/**
 * The benchmark's grid cells per data kind, in words (as coverage.md names them; "targets needing about
 * N entries" = the cells' n*, the known-σ size).
 */
export const GRID_WORDS: Record<DataKind, string> = {
  measurement:
    'normal data, and lognormal data (CV 0.5, 1, 2) with Cox’s interval; targets needing about 25 and 100 entries',
  count:
    'Poisson λ = 2, negative binomial m = 2 with k = 0.5 and 2; targets needing about 25 and 100 entries',
  'pass-fail': 'p = 0.02, 0.1 and 0.5; targets needing about 100 and 400 entries',
};

const KIND_WORDS: Record<DataKind, string> = {
  measurement: 'measurement',
  count: 'count',
  'pass-fail': 'pass/fail',
};

const range = (lo: number, hi: number) =>
  lo === hi ? `${lo.toFixed(1)} %` : `${lo.toFixed(1)}–${hi.toFixed(1)} %`;

/** The measured coverage of the study's rule for its data kind, as a sentence fragment, or null. */
export function coverageStatement(setup: { rule: RuleName; kind: DataKind }): string | null {
  const src = COVERAGE_SOURCE;
  if (src.date === null) return null;
  const run = `coverage benchmark ${src.file}, ${src.date}, ${src.replicatesPerCell ?? '?'} simulated studies per cell`;
  if (setup.rule === 'sprt') {
    const f = SPRT_ERROR_RATES.find((x) => x.kind === setup.kind);
    if (f === undefined) return null;
    return `wrong "above limit" at the lower end of the indifference zone in at most ${f.wrongAbovePercent} % of runs (asked: ${f.alphaPercent} %), wrong "below limit" at the upper end in at most ${f.wrongBelowPercent} % (asked: ${f.betaPercent} %), over ${f.rows} ${KIND_WORDS[setup.kind]} data model${f.rows === 1 ? '' : 's'} (${run})`;
  }
  const f = MEASURED_COVERAGE.find((x) => x.rule === setup.rule && x.kind === setup.kind);
  if (f === undefined) return null;
  return `the reported interval covered the true value in ${range(f.minPercent, f.maxPercent)} of runs across the ${f.cells} ${KIND_WORDS[setup.kind]} cells (${GRID_WORDS[setup.kind]}) of the ${run}, nominal ${src.nominalPercent} % two-sided`;
}
