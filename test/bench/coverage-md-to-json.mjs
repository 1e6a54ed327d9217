// One-off conversion of a coverage table written before the benchmark wrote JSON: reads the Markdown
// tables of test/bench/coverage.md (the layout test/bench/coverage-bench.ts prints) and writes the same
// figures in the JSON the benchmark now writes itself (shape: CoverageRun in src/export/coverage.ts), so
// the report reads numbers, not Markdown. Numbers are kept as printed (coverage to 0.1 point, SPRT error
// rates to 0.01 point).
//
// Run: node test/bench/coverage-md-to-json.mjs [test/bench/coverage.md] [src/export/coverage.json]
// Used once, for the run of 2026-12-01; later runs write the JSON directly
// (`npm run bench:coverage -- --out test/bench/coverage.md --json src/export/coverage.json`).
import { readFileSync, writeFileSync } from 'node:fs';

const [from = 'test/bench/coverage.md', to = 'src/export/coverage.json'] = process.argv.slice(2);
const md = readFileSync(from, 'utf8');

const kindOfCell = (name) =>
  /^(normal|lognormal)\b/i.test(name)
    ? 'measurement'
    : /^(Poisson|NB)\b/.test(name)
      ? 'count'
      : /^Bernoulli\b/.test(name)
        ? 'pass-fail'
        : null;
const kindOfSprt = (name) =>
  /^pass\/fail/i.test(name)
    ? 'pass-fail'
    : /counts/i.test(name)
      ? 'count'
      : /^(lognormal|normal)/i.test(name)
        ? 'measurement'
        : null;
const cells = (line) =>
  line
    .trim()
    .replace(/^\||\|$/g, '')
    .split(/(?<!\\)\|/)
    .map((c) => c.trim());
const num = (text, what) => {
  const v = Number(text);
  if (!Number.isFinite(v)) throw new Error(`${from}: ${what} "${text}" is not a number`);
  return v;
};
const percent = (text, what) => num(/^([\d.]+) %$/.exec(text)?.[1] ?? text, what);

const date = /Date: (\d{4}-\d{2}-\d{2})/.exec(md)?.[1];
const replicates = /R = (\d+) replicates per cell/.exec(md)?.[1];
const ratios = /standard-rule α ratios\s*\n?(\{[^}]*\})/.exec(md)?.[1];
if (!date || !replicates || !ratios) throw new Error(`${from}: date, R or the α ratios not found`);

const grid = [];
const sprt = [];
let table = null;
for (const line of md.split(/\r?\n/)) {
  if (!line.trim().startsWith('|')) {
    table = null;
    continue;
  }
  const c = cells(line);
  if (c[0] === 'cell' && c[2] === 'rule') table = 'grid';
  else if (c[0] === 'data' && /zone/.test(c[1] ?? '')) table = 'sprt';
  else if (/^-+$/.test(c[0] ?? '') || table === null) continue;
  else if (table === 'grid') {
    const kind = kindOfCell(c[0]);
    if (kind === null) throw new Error(`${from}: unknown cell "${c[0]}"`);
    const [cov, mc] = c[3].split('±').map((x) => num(x.trim(), 'coverage'));
    const [p10, p50, p90] = c[5].split('/').map((x) => num(x, 'n percentile'));
    grid.push({
      cell: c[0],
      kind,
      nStar: num(c[1], 'n*'),
      rule: c[2],
      coveragePercent: cov,
      mcMarginPercent: mc,
      meanNOverNStar: num(c[4], 'mean n/n*'),
      nP10: p10,
      nP50: p50,
      nP90: p90,
      atMinPercent: percent(c[6], 'at min'),
      cappedPercent: percent(c[7], 'capped'),
      goal: c[8] ?? '',
    });
  } else {
    const kind = kindOfSprt(c[0]);
    if (kind === null) throw new Error(`${from}: unknown SPRT row "${c[0]}"`);
    const [t0, t1] = c[1].split('–').map((x) => num(x.trim(), 'zone'));
    const [alpha, beta] = c[2].split(',').map((x) => num(x.trim(), 'α, β'));
    const [n0, n1] = c[5].split('/').map((x) => num(x.trim(), 'mean n'));
    const asn = c[6] === '–' ? [null, null] : c[6].split('/').map((x) => num(x.trim(), 'ASN'));
    sprt.push({
      data: c[0],
      kind,
      theta0: t0,
      theta1: t1,
      alpha,
      beta,
      wrongAbovePercent: percent(c[3], 'P(above)'),
      wrongBelowPercent: percent(c[4], 'P(below)'),
      meanN0: n0,
      meanN1: n1,
      waldAsn0: asn[0],
      waldAsn1: asn[1],
      truncatedAt: /^\d+$/.test(c[7]) ? Number(c[7]) : null,
      goal: c[8] ?? '',
    });
  }
}

const run = {
  benchmark: 'test/bench/coverage-bench.ts',
  table: 'test/bench/coverage.md',
  date,
  settings: {
    level: 0.95,
    sided: 'two',
    replicatesPerCell: Number(replicates),
    min: 10,
    capTimesNStar: 10,
    standardAlphaRatio: JSON.parse(ratios),
  },
  grid,
  sprt,
};
writeFileSync(to, `${JSON.stringify(run, null, 2)}\n`);
process.stdout.write(`${to}: ${grid.length} grid rows, ${sprt.length} SPRT rows from ${from} (${date})\n`);
