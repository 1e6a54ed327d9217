/**
 * Replay speed benchmark (`npm run bench:replay`; a benchmark, not a test — never part of `npm test`).
 *
 * Times the app's own per-entry path (src/assess/replay.ts, as `sure-enough replay` and the coverage
 * benchmark run it) on R sequences × L values for every data kind, interval method and stopping rule, and
 * one long count sequence, and prints the cost per entry. The floor is measured in the same run: the same
 * sequences replayed with no target (the running sums and the loop only, no interval and no rule), so a
 * figure reads as "so many times the bare loop" as well as in microseconds.
 *
 * Each cell's target is set so that the oracle size n* (known σ, nominal level) is 70 % of L: sequences run
 * close to the target for hundreds of entries, where a prefilter has the hardest time settling the verdict,
 * and some stop before L (the share stopped is printed; the standard rule's wider interval stops fewer). The
 * per-entry cost is the cell's time over the entries actually replayed (a stopped sequence replays its
 * entries up to the stop); the cell time includes each sequence's one full assessment at its end.
 * Values are drawn outside the timed region (common random numbers: sequence r of every cell of a data kind
 * reads the same values).
 *
 * Flags: --r N (sequences per cell, default 20000), --len L (values per sequence, default 1000),
 * --long N (the long count sequences, default 100000, and Land's of N/5; 0 skips them), --only TEXT (cells whose label contains
 * it), --skip TEXT (leave out cells whose label contains it), --json FILE (write the figures), --md FILE
 * (write them as a Markdown table), --budget S (seconds per cell, default 60: exit 1 when over).
 */
import { writeFileSync } from 'node:fs';
import { type PassFailMemo, replaySequence } from '../../src/assess/index.ts';
import type { AnalysisSetup, DataKind, MethodName, RuleName, Target } from '../../src/model/types.ts';
import { quantileCacheMisses } from '../../src/stats/quantile-cache.ts';
import { bernoulliVariate } from '../sim/bernoulli-variate.ts';
import { lognormalVariate } from '../sim/lognormal-variate.ts';
import { negativeBinomialVariate } from '../sim/negative-binomial-variate.ts';
import { poissonVariate } from '../sim/poisson-variate.ts';
import { createRng, type Rng } from '../sim/xoshiro128.ts';

const args = process.argv.slice(2);
const flag = (name: string): string | undefined => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : undefined;
};
const R = Number(flag('r') ?? 20000);
const L = Number(flag('len') ?? 1000);
const LONG = Number(flag('long') ?? 100000);
const ONLY = flag('only');
const SKIP = flag('skip');
const JSON_OUT = flag('json');
const MD_OUT = flag('md');
const BUDGET_S = Number(flag('budget') ?? 60);
const Z = 1.959963984540054; // Φ⁻¹(0.975)

interface Data {
  name: string;
  draw: (g: Rng) => number;
  /** true mean, and its coefficient of variation (for the targets) */
  mean: number;
  cv: number;
}
const DATA: Record<string, Data> = {
  lognormal: { name: 'lognormal mean 1 CV 1', draw: (g) => lognormalVariate(g, 1, 1), mean: 1, cv: 1 },
  poisson: { name: 'Poisson λ=2', draw: (g) => poissonVariate(g, 2), mean: 2, cv: Math.SQRT1_2 },
  clumped: { name: 'NB m=2 k=2', draw: (g) => negativeBinomialVariate(g, 2, 2), mean: 2, cv: 1 },
  bernoulli: { name: 'Bernoulli p=0.1', draw: (g) => bernoulliVariate(g, 0.1), mean: 0.1, cv: 3 },
};

interface Cell {
  label: string;
  data: Data;
  setup: AnalysisSetup;
}

const METHODS: Record<DataKind, (MethodName | undefined)[]> = {
  measurement: [undefined, 't', 'johnson-t', 'gamma', 'cox', 'land', 'chebyshev'],
  count: [undefined, 't', 'poisson-exact', 'quasi-poisson'],
  'pass-fail': ['wilson', 'wilson-cc', 'jeffreys', 'clopper-pearson', 'agresti-coull'],
};
const RULES: RuleName[] = ['standard', 'naive', 'strict', 'sprt'];

function targetFor(kind: DataKind, d: Data, rule: RuleName, nStar: number): Target {
  if (rule === 'sprt') return { kind: 'limit', value: d.mean };
  if (kind === 'pass-fail') return { kind: 'margin', value: Z * Math.sqrt((d.mean * (1 - d.mean)) / nStar) };
  return { kind: 'relative', value: (Z * d.cv) / Math.sqrt(nStar) };
}

function buildCells(length: number): Cell[] {
  const nStar = Math.round(0.7 * length);
  const cells: Cell[] = [];
  for (const kind of ['measurement', 'count', 'pass-fail'] as DataKind[]) {
    for (const method of METHODS[kind]) {
      const data =
        kind === 'measurement'
          ? DATA.lognormal
          : kind === 'pass-fail'
            ? DATA.bernoulli
            : method === 't' || method === 'quasi-poisson'
              ? DATA.clumped
              : DATA.poisson;
      const d = data as Data;
      for (const rule of RULES) {
        const setup: AnalysisSetup = {
          kind,
          level: 0.95,
          sided: rule === 'sprt' ? 'upper' : 'two',
          rule,
          min: 10,
          target: targetFor(kind, d, rule, nStar),
        };
        if (method !== undefined) setup.method = method;
        // the limit decision: an indifference zone of ±20 % about the true mean (±0.05 for pass/fail)
        if (rule === 'sprt') {
          const w = kind === 'pass-fail' ? 0.05 : 0.2 * d.mean;
          setup.sprt = { alpha: 0.05, beta: 0.1, lowerBound: d.mean - w / 2, upperBound: d.mean + w / 2 };
        }
        cells.push({ label: `${kind} ${method ?? 'default'} ${rule}`, data: d, setup });
      }
    }
  }
  return cells;
}

interface Figure {
  label: string;
  data: string;
  sequences: number;
  length: number;
  entries: number;
  stopped: number;
  /** numerical quantile inversions (cache misses) per 1,000 entries */
  inversionsPerThousand: number;
  seconds: number;
  usPerEntry: number;
  floorUsPerEntry: number;
  ratioToFloor: number;
  pass: boolean;
}

const seqCache = new Map<string, number[][]>();
function sequences(d: Data, r: number, len: number): number[][] {
  const key = `${d.name}|${r}|${len}`;
  let s = seqCache.get(key);
  if (s === undefined) {
    s = [];
    for (let i = 0; i < r; i++) {
      const rng = createRng(7919 * i + 17);
      const a = new Array<number>(len);
      for (let j = 0; j < len; j++) a[j] = d.draw(rng);
      s.push(a);
    }
    seqCache.clear(); // one data set in memory at a time
    seqCache.set(key, s);
  }
  return s;
}

/** Replays every sequence; returns seconds, entries replayed and sequences stopped. */
function time(
  setup: AnalysisSetup,
  seqs: number[][],
): { seconds: number; entries: number; stopped: number; inversions: number } {
  const memo: PassFailMemo = new Map();
  const misses = quantileCacheMisses();
  let entries = 0;
  let stopped = 0;
  const t0 = performance.now();
  for (const a of seqs) {
    const res = replaySequence(a, setup, memo);
    entries += res.stoppedAt ?? a.length;
    if (res.stoppedAt !== null) stopped++;
  }
  const seconds = (performance.now() - t0) / 1000;
  return { seconds, entries, stopped, inversions: quantileCacheMisses() - misses };
}

const floors = new Map<string, number>();
function floorUs(d: Data, kind: DataKind, seqs: number[][]): number {
  const key = `${d.name}|${seqs.length}|${seqs[0]?.length}`;
  const hit = floors.get(key);
  if (hit !== undefined) return hit;
  const bare: AnalysisSetup = { kind, level: 0.95, sided: 'two', rule: 'standard', min: 10 };
  const t = time(bare, seqs);
  const us = (t.seconds * 1e6) / t.entries;
  floors.set(key, us);
  return us;
}

function run(cell: Cell, r: number, len: number): Figure {
  const seqs = sequences(cell.data, r, len);
  const floor = floorUs(cell.data, cell.setup.kind, seqs);
  const t = time(cell.setup, seqs);
  const us = (t.seconds * 1e6) / t.entries;
  return {
    label: cell.label,
    data: cell.data.name,
    sequences: r,
    length: len,
    entries: t.entries,
    stopped: t.stopped,
    inversionsPerThousand: (1000 * t.inversions) / t.entries,
    seconds: t.seconds,
    usPerEntry: us,
    floorUsPerEntry: floor,
    ratioToFloor: us / floor,
    pass: t.seconds * (20000 / r) * (1000 / len) <= BUDGET_S,
  };
}

function print(f: Figure): void {
  const cols = [
    f.label.padEnd(36),
    `${f.seconds.toFixed(2).padStart(7)} s`,
    `${f.usPerEntry.toFixed(2).padStart(8)} µs/entry`,
    `floor ${f.floorUsPerEntry.toFixed(2).padStart(5)} µs`,
    `×${f.ratioToFloor.toFixed(1).padStart(6)}`,
    `stopped ${String(f.stopped).padStart(6)}/${f.sequences}`,
    `inversions ${f.inversionsPerThousand.toFixed(2).padStart(7)}‰`,
    f.pass ? 'ok' : 'OVER',
  ];
  console.log(cols.join('  '));
}

const figures: Figure[] = [];
const started = performance.now();
console.log(
  `replay benchmark: ${R} sequences × ${L} values per cell (budget ${BUDGET_S} s at 20,000 × 1,000)`,
);
for (const cell of buildCells(L)) {
  if (ONLY !== undefined && !cell.label.includes(ONLY)) continue;
  if (SKIP !== undefined && cell.label.includes(SKIP)) continue;
  const f = run(cell, R, L);
  figures.push(f);
  print(f);
}
if (LONG > 0) {
  // one long sequence against a target it never meets: every entry is replayed, and nothing is shared
  // with other sequences (Land's table of nodes, the quantile cache)
  const longCells: { label: string; setup: AnalysisSetup; data: Data; length: number }[] = [];
  for (const method of [undefined, 'poisson-exact', 't'] as const) {
    const setup: AnalysisSetup = {
      kind: 'count',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      min: 10,
      target: { kind: 'relative', value: 1e-4 },
    };
    if (method !== undefined) setup.method = method;
    const data = method === 't' ? (DATA.clumped as Data) : (DATA.poisson as Data);
    longCells.push({
      label: `count ${method ?? 'default'} standard, one sequence of ${LONG}`,
      setup,
      data,
      length: LONG,
    });
  }
  const landLength = Math.max(1, Math.round(LONG / 5));
  for (const rule of ['standard', 'naive'] as const)
    longCells.push({
      label: `measurement land ${rule}, one sequence of ${landLength}`,
      setup: {
        kind: 'measurement',
        method: 'land',
        level: 0.95,
        sided: 'two',
        rule,
        min: 10,
        target: { kind: 'relative', value: 1e-3 },
      },
      data: DATA.lognormal as Data,
      length: landLength,
    });
  for (const c of longCells) {
    if (ONLY !== undefined && !c.label.includes(ONLY)) continue;
    if (SKIP !== undefined && c.label.includes(SKIP)) continue;
    const f = run({ label: c.label, data: c.data, setup: c.setup }, 1, c.length);
    f.pass = f.seconds <= BUDGET_S;
    figures.push(f);
    print(f);
  }
}
const total = (performance.now() - started) / 1000;
console.log(`total ${total.toFixed(1)} s; node ${process.version}`);
if (JSON_OUT !== undefined)
  writeFileSync(
    JSON_OUT,
    `${JSON.stringify({ node: process.version, sequences: R, length: L, budgetSeconds: BUDGET_S, totalSeconds: total, figures }, null, 2)}\n`,
  );
if (MD_OUT !== undefined) {
  const rows = figures.map(
    (f) =>
      `| ${f.label} | ${f.data} | ${f.sequences} × ${f.length} | ${f.seconds.toFixed(1)} | ${f.usPerEntry.toFixed(2)} | ${f.floorUsPerEntry.toFixed(2)} | ${f.ratioToFloor.toFixed(1)} | ${f.stopped} | ${f.inversionsPerThousand.toFixed(2)} | ${f.pass ? 'yes' : 'NO'} |`,
  );
  writeFileSync(
    MD_OUT,
    [
      `Node ${process.version}; ${R} sequences × ${L} values per cell; total ${total.toFixed(0)} s.`,
      '',
      '| cell | data | sequences × values | s | µs per entry | floor µs | × floor | stopped | inversions ‰ | under budget |',
      '| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |',
      ...rows,
      '',
    ].join('\n'),
  );
}
const over = figures.filter((f) => !f.pass);
if (over.length > 0) {
  console.log(`${over.length} cell(s) over budget: ${over.map((f) => f.label).join('; ')}`);
  process.exitCode = 1;
}
