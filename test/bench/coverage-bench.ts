/**
 * Coverage benchmark of the stopping rules (`npm run bench:coverage`; a benchmark, not a test).
 *
 * Runs a Monte Carlo grid of distributions, oracle sizes and rules (stated in the output) through the app's
 * own per-entry path (src/assess/replay.ts: the running assessment, verdict only per entry) and prints, per
 * cell and side by side for the naive rule and every rule offered: realised coverage of the reported interval
 * with its 95 % Monte Carlo margin (1.96·√(c(1−c)/R)), mean n / n*, the 10th/50th/90th percentiles of n, the
 * share stopped at the minimum and the share capped (never stopped before 10·n*); for the limit decision the
 * realised error rates at the two ends of the indifference zone and the mean n against Wald's ASN.
 *
 * Common random numbers: replicate r of a cell draws one sequence of 10·n* values from the seed
 * (cell seed, r), and every rule reads that same sequence.
 *
 * n* is the known-σ oracle size: absolute margin d = z·σ/√n* (normal, pass/fail), relative margin
 * r = z·CV/√n* (lognormal, counts), precision D = CV/√n* (Green / Kuno cells).
 *
 * Flags: --r N (replicates per cell, default 10000: about 5 min on this 2-core machine; 20000 doubles it), --quick (R = 2000), --out FILE (markdown),
 * --json FILE (the same figures as numbers, the shape CoverageRun of src/export/coverage.ts, which the
 * report reads from src/export/coverage.json), --calibrate (scan the standard rule's α ratio per data kind
 * instead of the grid). A committed run is refreshed with
 * `npm run bench:coverage -- --out test/bench/coverage.md --json src/export/coverage.json`.
 */
import { writeFileSync } from 'node:fs';
import { replaySequence } from '../../src/assess/index.ts';
import type { CoverageRow, CoverageRun, SprtRow } from '../../src/export/coverage.ts';
import type { AnalysisSetup, RuleName } from '../../src/model/types.ts';
import { normalQuantile } from '../../src/stats/distributions.ts';
import { sprtMaxN, sprtModelOf } from '../../src/stop/sprt.ts';
import { sprtOperatingCharacteristic } from '../../src/stop/sprt-operating-characteristic.ts';
import { STANDARD_ALPHA_RATIO, type StandardGroup } from '../../src/stop/standard-level.ts';
import { bernoulliVariate } from '../sim/bernoulli-variate.ts';
import { lognormalVariate } from '../sim/lognormal-variate.ts';
import { negativeBinomialVariate } from '../sim/negative-binomial-variate.ts';
import { normalVariate } from '../sim/normal-variate.ts';
import { poissonVariate } from '../sim/poisson-variate.ts';
import { createRng, type Rng } from '../sim/xoshiro128.ts';

const args = process.argv.slice(2);
const flag = (name: string): string | undefined => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? args[i + 1] : undefined;
};
const R = args.includes('--quick') ? 2000 : Number(flag('r') ?? 10000);
const OUT = flag('out');
const JSON_OUT = flag('json');
/** The figures as printed (same rounding), for --json. */
const gridRows: CoverageRow[] = [];
const sprtRows: SprtRow[] = [];
const round = (x: number, d: number) => Number(x.toFixed(d));
const LEVEL = 0.95;
const Z = normalQuantile(1 - (1 - LEVEL) / 2);

interface Cell {
  name: string;
  group: StandardGroup;
  nStar: number;
  min: number;
  truth: number;
  draw: (rng: Rng) => number;
  base: AnalysisSetup;
  /** Extra labelled setups run only in this cell (e.g. raw-scale t on lognormal data, Green / Kuno). */
  extra?: { label: string; setup: AnalysisSetup }[];
  seed: number;
}

interface RuleStats {
  label: string;
  coverage: number;
  margin: number;
  meanRatio: number;
  p10: number;
  p50: number;
  p90: number;
  atMin: number;
  capped: number;
}

function setupFor(
  kind: AnalysisSetup['kind'],
  target: AnalysisSetup['target'],
  min: number,
  method?: AnalysisSetup['method'],
) {
  const s: AnalysisSetup = { kind, level: LEVEL, sided: 'two', rule: 'standard', min };
  if (target) s.target = target;
  if (method) s.method = method;
  return s;
}

function buildCells(): Cell[] {
  const cells: Cell[] = [];
  let seed = 1000;
  for (const nStar of [25, 100]) {
    cells.push({
      name: `normal μ=10 σ=1`,
      group: 'measurement',
      nStar,
      min: 10,
      truth: 10,
      draw: (g) => normalVariate(g, 10, 1),
      base: setupFor('measurement', { kind: 'margin', value: Z / Math.sqrt(nStar) }, 10),
      seed: seed++,
    });
    for (const cv of [0.5, 1, 2]) {
      const target = { kind: 'relative' as const, value: (Z * cv) / Math.sqrt(nStar) };
      cells.push({
        name: `lognormal CV ${cv}`,
        group: 'measurement-log',
        nStar,
        min: 10,
        truth: 1,
        draw: (g) => lognormalVariate(g, 1, cv),
        base: setupFor('measurement', target, 10, 'cox'),
        extra: [
          { label: 'naive t (raw)', setup: { ...setupFor('measurement', target, 10, 't'), rule: 'naive' } },
          { label: 'standard t (raw)', setup: setupFor('measurement', target, 10, 't') },
        ],
        seed: seed++,
      });
    }
    const counts: { name: string; mean: number; k?: number; draw: (g: Rng) => number }[] = [
      { name: 'Poisson λ=2', mean: 2, draw: (g) => poissonVariate(g, 2) },
      { name: 'NB m=2 k=0.5', mean: 2, k: 0.5, draw: (g) => negativeBinomialVariate(g, 2, 0.5) },
      { name: 'NB m=2 k=2', mean: 2, k: 2, draw: (g) => negativeBinomialVariate(g, 2, 2) },
    ];
    for (const c of counts) {
      const variance = c.mean + (c.k ? (c.mean * c.mean) / c.k : 0);
      const cv = Math.sqrt(variance) / c.mean;
      const D = cv / Math.sqrt(nStar);
      // Iwao's regression from the true distribution: s² = (α+1)m + (β−1)m² → α = 0, β = 1 + 1/k.
      const iwaoBeta = 1 + (c.k ? 1 / c.k : 0);
      // Taylor's power law fitted locally at the true mean: b = d ln s²/d ln m, a = s²/m^b.
      const b = (c.mean + (c.k ? (2 * c.mean * c.mean) / c.k : 0)) / variance;
      const a = variance / c.mean ** b;
      const precision = { kind: 'precision' as const, value: D };
      cells.push({
        name: `${c.name}`,
        group: 'count',
        nStar,
        min: 10,
        truth: c.mean,
        draw: c.draw,
        base: setupFor('count', { kind: 'relative', value: Z * D }, 10),
        extra: [
          {
            label: 'Green (Taylor a, b)',
            setup: { ...setupFor('count', precision, 10), planning: { taylorA: a, taylorB: b } },
          },
          {
            label: 'Kuno (Iwao α, β)',
            setup: { ...setupFor('count', precision, 10), planning: { iwaoAlpha: 0, iwaoBeta } },
          },
        ],
        seed: seed++,
      });
    }
  }
  for (const nStar of [100, 400]) {
    for (const p of [0.02, 0.1, 0.5]) {
      cells.push({
        name: `Bernoulli p=${p}`,
        group: 'pass-fail',
        nStar,
        min: 10,
        truth: p,
        draw: (g) => bernoulliVariate(g, p),
        base: setupFor('pass-fail', { kind: 'margin', value: Z * Math.sqrt((p * (1 - p)) / nStar) }, 10),
        seed: seed++,
      });
    }
  }
  return cells;
}

function quantile(sorted: number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] as number;
}

function runSetups(cell: Cell, setups: { label: string; setup: AnalysisSetup }[], reps: number): RuleStats[] {
  const cap = 10 * cell.nStar;
  const acc = setups.map(() => ({ covered: 0, ns: [] as number[], atMin: 0, capped: 0 }));
  const memos = setups.map(() => new Map<number, boolean>());
  const seq = new Array<number>(cap);
  for (let r = 0; r < reps; r++) {
    const rng = createRng(cell.seed * 1_000_003 + r);
    for (let i = 0; i < cap; i++) seq[i] = cell.draw(rng);
    setups.forEach(({ setup }, j) => {
      const res = replaySequence(seq, setup, memos[j]);
      const a = acc[j]!;
      const n = res.stoppedAt ?? cap;
      if (res.stoppedAt === null) a.capped++;
      if (n === cell.min) a.atMin++;
      a.ns.push(n);
      const lo = res.lower ?? Number.NEGATIVE_INFINITY;
      const hi = res.upper ?? Number.POSITIVE_INFINITY;
      if (lo <= cell.truth && cell.truth <= hi) a.covered++;
    });
  }
  return setups.map(({ label }, j) => {
    const a = acc[j]!;
    const c = a.covered / reps;
    const sorted = a.ns.sort((x, y) => x - y);
    const mean = sorted.reduce((s, x) => s + x, 0) / reps;
    return {
      label,
      coverage: c,
      margin: 1.96 * Math.sqrt((c * (1 - c)) / reps),
      meanRatio: mean / cell.nStar,
      p10: quantile(sorted, 0.1),
      p50: quantile(sorted, 0.5),
      p90: quantile(sorted, 0.9),
      atMin: a.atMin / reps,
      capped: a.capped / reps,
    };
  });
}

const pct = (x: number, d = 1) => (100 * x).toFixed(d);

/** PASS; "within MC" when the shortfall is inside the Monte Carlo margin; SHORT otherwise. */
function goalOf(cell: Cell, s: RuleStats, rule: string): string {
  const verdict = (goal: number, costOk: boolean) =>
    !costOk ? 'SHORT' : s.coverage >= goal ? 'PASS' : s.coverage + s.margin >= goal ? 'within MC' : 'SHORT';
  if (rule === 'standard') {
    if (cell.nStar < 25) return 'n/a';
    return verdict(LEVEL - 0.01, s.meanRatio <= 1.25);
  }
  if (rule === 'strict') return verdict(LEVEL, true);
  return '';
}

function grid(): string {
  const lines: string[] = [];
  const print = (line: string) => {
    lines.push(line);
    process.stdout.write(`${line}\n`);
  };
  const started = Date.now();
  print('| cell | n* | rule | coverage ± MC | mean n/n* | n p10/p50/p90 | at min | capped | goal |');
  print('|---|---|---|---|---|---|---|---|---|');
  const shortfalls: string[] = [];
  for (const cell of buildCells()) {
    const t0 = Date.now();
    const rules: { label: string; setup: AnalysisSetup }[] = (
      ['naive', 'standard', 'strict'] as RuleName[]
    ).map((rule) => ({ label: rule, setup: { ...cell.base, rule } }));
    for (const e of cell.extra ?? []) rules.push(e);
    const stats = runSetups(cell, rules, R);
    for (const s of stats) {
      const goal = goalOf(cell, s, s.label);
      if (goal === 'SHORT')
        shortfalls.push(
          `${cell.name} n*=${cell.nStar} ${s.label}: ${pct(s.coverage)} %, n/n* ${s.meanRatio.toFixed(2)}`,
        );
      print(
        `| ${cell.name} | ${cell.nStar} | ${s.label} | ${pct(s.coverage)} ± ${pct(s.margin)} | ${s.meanRatio.toFixed(2)} | ${s.p10}/${s.p50}/${s.p90} | ${pct(s.atMin)} % | ${pct(s.capped)} % | ${goal} |`,
      );
      gridRows.push({
        cell: cell.name,
        kind: cell.base.kind,
        nStar: cell.nStar,
        rule: s.label,
        coveragePercent: Number(pct(s.coverage)),
        mcMarginPercent: Number(pct(s.margin)),
        meanNOverNStar: round(s.meanRatio, 2),
        nP10: s.p10,
        nP50: s.p50,
        nP90: s.p90,
        atMinPercent: Number(pct(s.atMin)),
        cappedPercent: Number(pct(s.capped)),
        goal,
      });
    }
    process.stderr.write(`  (${cell.name} n*=${cell.nStar}: ${((Date.now() - t0) / 1000).toFixed(1)} s)\n`);
  }
  print('');
  print('### Limit decision (Wald SPRT): realised error rates at the ends of the indifference zone');
  print('');
  print(
    '| data | zone θ₀ – θ₁ | α, β | P(above \\| θ₀) | P(below \\| θ₁) | mean n at θ₀ / θ₁ | Wald ASN θ₀ / θ₁ | truncated at | goal |',
  );
  print('|---|---|---|---|---|---|---|---|---|');
  const sprtCells: {
    name: string;
    kind: AnalysisSetup['kind'];
    t0: number;
    t1: number;
    draw: (g: Rng, theta: number) => number;
    extra?: Partial<AnalysisSetup>;
  }[] = [
    { name: 'pass/fail', kind: 'pass-fail', t0: 0.02, t1: 0.08, draw: (g, t) => bernoulliVariate(g, t) },
    { name: 'Poisson counts', kind: 'count', t0: 1.5, t1: 2.5, draw: (g, t) => poissonVariate(g, t) },
    {
      name: 'NB counts k=2 (k given)',
      kind: 'count',
      t0: 1.5,
      t1: 2.5,
      draw: (g, t) => negativeBinomialVariate(g, t, 2),
      extra: { planning: { negBinomialK: 2 } },
    },
    {
      name: 'lognormal CV 1 (log scale, σ estimated)',
      kind: 'measurement',
      t0: 0.8,
      t1: 1.25,
      draw: (g, t) => lognormalVariate(g, t, 1),
    },
  ];
  let seed = 9000;
  for (const c of sprtCells) {
    const setup: AnalysisSetup = {
      kind: c.kind,
      level: LEVEL,
      sided: 'two',
      rule: 'sprt',
      min: 10,
      target: { kind: 'limit', value: (c.t0 + c.t1) / 2 },
      sprt: { alpha: 0.05, beta: 0.1, lowerBound: c.t0, upperBound: c.t1 },
      ...c.extra,
    };
    const result: { wrong: number; meanN: number; maxN: number }[] = [];
    for (const [theta, wrongVerdict] of [
      [c.t0, 'above limit'],
      [c.t1, 'below limit'],
    ] as const) {
      const s = seed++;
      let wrong = 0;
      let total = 0;
      let maxN = 0;
      const memo = new Map<number, boolean>();
      // the truncation point depends on the pilot only for measurements; 3000 values is always enough here
      const len = 3000;
      const seq = new Array<number>(len);
      for (let r = 0; r < R; r++) {
        const rng = createRng(s * 1_000_003 + r);
        for (let i = 0; i < len; i++) seq[i] = c.draw(rng, theta);
        const res = replaySequence(seq, setup, memo);
        if (res.verdict === wrongVerdict) wrong++;
        total += res.stoppedAt ?? len;
        maxN = Math.max(maxN, res.stoppedAt ?? len);
      }
      result.push({ wrong: wrong / R, meanN: total / R, maxN });
    }
    const model =
      c.kind === 'measurement'
        ? {
            family: 'lognormal' as const,
            theta0: c.t0,
            theta1: c.t1,
            alpha: 0.05,
            beta: 0.1,
            sigma: Math.sqrt(Math.log(2)),
          }
        : sprtModelOf(setup, []);
    const asn = model
      ? [c.t0, c.t1].map((t) => sprtOperatingCharacteristic(model, t).asn.toFixed(1)).join(' / ')
      : '–';
    const trunc = model && c.kind !== 'measurement' ? String(sprtMaxN(setup, model)) : 'from pilot';
    const [r0, r1] = result as [(typeof result)[0], (typeof result)[0]];
    const goal = r0.wrong <= 0.05 && r1.wrong <= 0.1 ? 'PASS' : 'SHORT';
    if (goal === 'SHORT') shortfalls.push(`SPRT ${c.name}: α̂ ${pct(r0.wrong)} %, β̂ ${pct(r1.wrong)} %`);
    print(
      `| ${c.name} | ${c.t0} – ${c.t1} | 0.05, 0.10 | ${pct(r0.wrong, 2)} % | ${pct(r1.wrong, 2)} % | ${r0.meanN.toFixed(1)} / ${r1.meanN.toFixed(1)} | ${asn} | ${trunc} | ${goal} |`,
    );
    const asns = asn === '–' ? [null, null] : asn.split(' / ').map(Number);
    sprtRows.push({
      data: c.name,
      kind: c.kind,
      theta0: c.t0,
      theta1: c.t1,
      alpha: 0.05,
      beta: 0.1,
      wrongAbovePercent: Number(pct(r0.wrong, 2)),
      wrongBelowPercent: Number(pct(r1.wrong, 2)),
      meanN0: round(r0.meanN, 1),
      meanN1: round(r1.meanN, 1),
      waldAsn0: asns[0] ?? null,
      waldAsn1: asns[1] ?? null,
      truncatedAt: /^\d+$/.test(trunc) ? Number(trunc) : null,
      goal,
    });
  }
  print('');
  print(`Shortfalls: ${shortfalls.length === 0 ? 'none' : ''}`);
  for (const s of shortfalls) print(`- ${s}`);
  print('');
  print(`Run time ${((Date.now() - started) / 1000).toFixed(0)} s.`);
  return lines.join('\n');
}

function calibrate(): void {
  const ratios = (flag('ratios') ?? '1,0.9,0.8,0.7,0.6,0.5,0.4').split(',').map(Number);
  const only = flag('group');
  const cells = buildCells().filter((c) => c.nStar >= 25 && (only === undefined || c.group === only));
  const groups = [...new Set(cells.map((c) => c.group))];
  const table = STANDARD_ALPHA_RATIO as Record<StandardGroup, number>;
  for (const g of groups) {
    for (const rho of ratios) {
      table[g] = rho;
      let worstCov = 1;
      let worstN = 0;
      const parts: string[] = [];
      for (const cell of cells.filter((c) => c.group === g)) {
        const [s] = runSetups(cell, [{ label: 'standard', setup: { ...cell.base, rule: 'standard' } }], R);
        worstCov = Math.min(worstCov, s!.coverage);
        worstN = Math.max(worstN, s!.meanRatio);
        parts.push(`${cell.name}/${cell.nStar}: ${pct(s!.coverage)} (${s!.meanRatio.toFixed(2)})`);
      }
      process.stdout.write(
        `${g} ρ=${rho}: worst coverage ${pct(worstCov)} %, worst n/n* ${worstN.toFixed(2)} | ${parts.join('; ')}\n`,
      );
    }
  }
}

if (args.includes('--calibrate')) calibrate();
else {
  const body = grid();
  if (OUT) {
    const header = [
      '# Coverage benchmark of the stopping rules',
      '',
      `Date: ${new Date().toISOString().slice(0, 10)}. Command: \`npm run bench:coverage -- --out test/bench/coverage.md\`.`,
      `Settings: nominal level ${LEVEL} two-sided, R = ${R} replicates per cell, minimum m = 10, cap 10·n*, common random`,
      'numbers across rules within a cell (xoshiro128**, seed per cell and replicate), standard-rule α ratios',
      `${JSON.stringify(STANDARD_ALPHA_RATIO)} (internal level = 1 − ρ·(1 − level)).`,
      'Goals: standard covers ≥ nominal − 1 pp with mean n ≤ 1.25·n* in every cell with n* ≥ 25; strict covers ≥ nominal;',
      'the limit decision realises error rates ≤ the chosen α and β at the ends of the indifference zone.',
      'Coverage margin = 1.96·√(c(1−c)/R). Targets from n*: margin z·σ/√n* (normal, pass/fail), relative z·CV/√n*',
      '(lognormal, counts; Cox method for lognormal unless marked raw), precision CV/√n* (Green, Kuno).',
      '',
    ].join('\n');
    writeFileSync(OUT, `${header}\n${body}\n`);
  }
  if (JSON_OUT) {
    const run: CoverageRun = {
      benchmark: 'test/bench/coverage-bench.ts',
      table: OUT ?? 'test/bench/coverage.md',
      date: new Date().toISOString().slice(0, 10),
      settings: {
        level: LEVEL,
        sided: 'two',
        replicatesPerCell: R,
        min: 10,
        capTimesNStar: 10,
        standardAlphaRatio: { ...STANDARD_ALPHA_RATIO },
      },
      grid: gridRows,
      sprt: sprtRows,
    };
    writeFileSync(JSON_OUT, `${JSON.stringify(run, null, 2)}\n`);
  }
}
