/**
 * The stopping rules' measured coverage, for the report's method statement.
 *
 * Source: this project's coverage benchmark (test/bench/coverage-bench.ts), whose run is committed as
 * numbers in coverage.json beside this file (written in the same run as the readable table with notes,
 * test/bench/coverage.md: `npm run bench:coverage -- --r 10000 --methods --out test/bench/coverage.md --json
 * src/export/coverage.json`). Nothing here is typed by hand: the figures below are summarised from the JSON.
 * A rule or data kind without a figure gives null, and the report then says "not yet measured".
 *
 * Summary per rule and data kind: the lowest and highest realised coverage (percent, as the benchmark
 * prints it, one decimal) over the grid rows of that kind whose rule is exactly the rule's name (rows
 * such as `naive t (raw)` or `Green (Taylor a, b)` are other methods, not the rule as offered).
 * The SPRT is summarised by its realised error rates at the two ends of the indifference zone (largest
 * over the benchmark's rows of that data kind).
 */
import type { DataKind, RuleName } from '../model/types.ts';
import benchmarkRun from './coverage.json' with { type: 'json' };

/** One grid row of the benchmark: a cell (data model and oracle size n*) run through one rule. */
export interface CoverageRow {
  cell: string;
  kind: DataKind;
  nStar: number;
  /** The rule's name (`naive`, `standard`, `strict`), or another method's label (`standard t (raw)`). */
  rule: string;
  coveragePercent: number;
  /** 95 % Monte Carlo margin, 1.96·√(c(1−c)/R), in points. */
  mcMarginPercent: number;
  meanNOverNStar: number;
  nP10: number;
  nP50: number;
  nP90: number;
  atMinPercent: number;
  cappedPercent: number;
  /** PASS, within MC, SHORT, n/a or empty (no goal for this rule). */
  goal: string;
}

/** One limit-decision row: the SPRT's realised error rates at the ends of the indifference zone. */
export interface SprtRow {
  data: string;
  kind: DataKind;
  theta0: number;
  theta1: number;
  alpha: number;
  beta: number;
  /** Realised rate of "above limit" at θ₀ and of "below limit" at θ₁, in percent. */
  wrongAbovePercent: number;
  wrongBelowPercent: number;
  meanN0: number;
  meanN1: number;
  /** Wald's average sample number at θ₀ and θ₁ (null where the benchmark has none). */
  waldAsn0: number | null;
  waldAsn1: number | null;
  /** The truncation point, or null when it comes from the pilot (measurements). */
  truncatedAt: number | null;
  goal: string;
}

/** What the benchmark writes (coverage.json). */
export interface CoverageRun {
  benchmark: string;
  /** The readable table of the same run (with notes). */
  table: string;
  date: string;
  settings: {
    level: number;
    sided: string;
    replicatesPerCell: number;
    min: number;
    capTimesNStar: number;
    standardAlphaRatio: Record<string, number>;
  };
  grid: CoverageRow[];
  sprt: SprtRow[];
}

export const COVERAGE_RUN: CoverageRun = benchmarkRun as CoverageRun;

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

/** Which benchmark run the figures come from. */
export const COVERAGE_SOURCE: {
  file: string;
  date: string | null;
  nominalPercent: number;
  replicatesPerCell: number | null;
} = {
  file: COVERAGE_RUN.table,
  date: COVERAGE_RUN.date,
  nominalPercent: Math.round(COVERAGE_RUN.settings.level * 1000) / 10,
  replicatesPerCell: COVERAGE_RUN.settings.replicatesPerCell,
};

const KINDS: readonly DataKind[] = ['measurement', 'count', 'pass-fail'];
const RULES = ['naive', 'standard', 'strict'] as const;

/** Per rule and data kind: lowest and highest coverage over the grid rows of exactly that rule. */
export const MEASURED_COVERAGE: readonly CoverageFigure[] = RULES.flatMap((rule) =>
  KINDS.flatMap((kind) => {
    const xs = COVERAGE_RUN.grid
      .filter((r) => r.rule === rule && r.kind === kind)
      .map((r) => r.coveragePercent);
    return xs.length === 0
      ? []
      : [{ rule, kind, cells: xs.length, minPercent: Math.min(...xs), maxPercent: Math.max(...xs) }];
  }),
);

/** Per data kind: the largest realised SPRT error rates over the benchmark's rows of that kind. */
export const SPRT_ERROR_RATES: readonly SprtFigure[] = KINDS.flatMap((kind) => {
  const rows = COVERAGE_RUN.sprt.filter((r) => r.kind === kind);
  if (rows.length === 0) return [];
  return [
    {
      kind,
      rows: rows.length,
      wrongAbovePercent: Math.max(...rows.map((r) => r.wrongAbovePercent)),
      wrongBelowPercent: Math.max(...rows.map((r) => r.wrongBelowPercent)),
      alphaPercent: Math.round(Math.max(...rows.map((r) => r.alpha)) * 1e8) / 1e6,
      betaPercent: Math.round(Math.max(...rows.map((r) => r.beta)) * 1e8) / 1e6,
    },
  ];
});

/** The oracle sizes n* of the grid rows of one data kind, ascending ("targets needing about …"). */
export function gridSizes(kind: DataKind): number[] {
  return [...new Set(COVERAGE_RUN.grid.filter((r) => r.kind === kind).map((r) => r.nStar))].sort(
    (a, b) => a - b,
  );
}

/**
 * The benchmark's grid cells per data kind, in words, from the rows themselves: the data models (a cell is
 * named "model · target"), the targets, and "targets needing about N entries" (the cells' n*, the known-σ size).
 */
function gridWords(kind: DataKind): string {
  const rows = COVERAGE_RUN.grid.filter((r) => r.kind === kind);
  const part = (i: number) => [
    ...new Set(rows.map((r) => r.cell.split(' · ')[i]).filter((x): x is string => x !== undefined)),
  ];
  const targets = part(1);
  const list = (xs: string[]) =>
    xs.length <= 1 ? (xs[0] ?? '') : `${xs.slice(0, -1).join(', ')} and ${xs.at(-1)}`;
  return `${list(part(0))}${targets.length > 0 ? `, with ${list(targets)} targets` : ''}; ${sizes(kind)}`;
}
const sizes = (kind: DataKind) => `targets needing about ${gridSizes(kind).join(', ')} entries`;
export const GRID_WORDS: Record<DataKind, string> = {
  measurement: gridWords('measurement'),
  count: gridWords('count'),
  'pass-fail': gridWords('pass-fail'),
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
