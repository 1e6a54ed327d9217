/**
 * The printable report: one self-contained HTML page (no script, no external resource; print CSS so the
 * browser's "Print → Save as PDF" gives the paper copy). It shows the study setup, the verdict and
 * interval, the method in plain words (interval, stopping rule and the rule's measured coverage), an
 * inline SVG chart of the running interval, the entry count with voids, each collector's share, likely
 * duplicates, warnings, the cautions, the SHA-256 of the event log and the bundle checksum, and the
 * commands that reproduce the numbers (recipe.ts: `sure-enough export --format values` then
 * `sure-enough assess` with the study's flags, strata, design and non-detect method included).
 *
 * The running-interval chart uses the same assessment as the result: the design-aware estimate (stratified
 * mean, primary units, composites, Kaplan–Meier) from the first entry at which the study's design applies,
 * the simple running estimate otherwise — so its last point is the reported interval.
 *
 * Everything typed by a user (study name, notes, units, labels, device names, reasons) is HTML-escaped
 * (`escapeHtml`): the five characters & < > " ' become character references (HTML Living Standard,
 * §13.1.4 "character references"), so no typed text can open an element or an attribute.
 */
import { assess, assessSummary } from '../assess.ts';
import { type Bundle, eventLogHash } from '../bundle/bundle.ts';
import { collectorShares, countedEntries, logCounts, pointsOf } from '../bundle/events.ts';
import { likelyDuplicates } from '../bundle/merge.ts';
import { assessDesign } from '../design/index.ts';
import type { StudySetup } from '../model/records.ts';
import type { Assessment, Target } from '../model/types.ts';
import { RunningSummary } from '../stats/running-summary.ts';
import { COVERAGE_SOURCE } from './coverage.ts';
import { recipeCommands, recipeGaps } from './recipe.ts';

export { assessFlags } from './recipe.ts';

export interface ReportOptions {
  /**
   * The stopping rule's measured coverage in words (from the coverage benchmark), or null when it has not
   * been measured: the report then says "not yet measured".
   */
  coverage: string | null;
  /** When the report was made (ISO 8601); left out when absent so the page is reproducible. */
  generatedAt?: string;
}

/** The cautions shown at setup, on the report and in the README (DESIGN.md, "Cautions"). */
export const CAUTIONS = [
  'The tool gives statistical guidance only. The approved sampling plan, the site safety plan, the regulator’s decision rule, accredited laboratories and licensed professionals take precedence.',
  'Never take one more sample where conditions are unsafe (traffic, confined spaces, water, weather, hazardous material, lone working).',
  'Regulatory limits change: they are entered by the user with their source and date, never built in.',
];

export function escapeHtml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

const esc = (v: unknown): string => escapeHtml(v === undefined || v === null ? '' : String(v));

/** A number for reading: up to 4 significant digits, no exponent for everyday magnitudes. */
export function fmt(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-4 && a < 1e9) return String(Number(x.toPrecision(4)));
  return x.toExponential(3);
}

const pct = (x: number): string => `${Number((x * 100).toPrecision(4))} %`;

function targetWords(t: Target | undefined, setup: StudySetup): string {
  if (!t) return 'none (interval only)';
  const unit = setup.kind === 'pass-fail' ? '' : setup.unit ? ` ${setup.unit}` : '';
  switch (t.kind) {
    case 'margin':
      return `margin of error ± ${fmt(t.value)}${unit}`;
    case 'relative':
      return `relative margin ± ${pct(t.value)} of the estimate`;
    case 'precision':
      return `relative precision SE/mean ≤ ${fmt(t.value)}`;
    case 'limit':
      return `decide below or above the limit ${fmt(t.value)}${unit}${t.source ? ` (source: ${t.source}${t.date ? `, ${t.date}` : ''})` : t.date ? ` (${t.date})` : ''}`;
  }
}

function ruleWords(rule: StudySetup['rule']): string {
  switch (rule) {
    case 'standard':
      return 'the standard rule: after every entry the interval is checked against the target at a raised confidence level, calibrated by simulation so that looking after every entry does not lower the coverage below the stated level';
    case 'strict':
      return 'the strict rule: a plan that stays valid however often the interval is looked at';
    case 'sprt':
      return 'Wald’s sequential probability ratio test against the limit';
    case 'naive':
      return 'the naive rule (stop the first time the fixed-sample interval meets the target), which is known to under-cover';
  }
}

function kindWords(setup: StudySetup): string {
  if (setup.kind === 'count')
    return `count per plot${setup.plotArea !== undefined ? ` (plot area ${setup.plotArea}${setup.plotAreaUnit ? ` ${setup.plotAreaUnit}` : ''})` : ''}`;
  if (setup.kind === 'pass-fail') return 'pass/fail: 1 = the counted outcome, 0 = not';
  return `measurement${setup.unit ? ` in ${setup.unit}` : ''}`;
}

/** Estimators of src/design, by their `method` name (the report says their coverage was not benchmarked). */
const DESIGN_METHODS = new Set([
  'stratified-t',
  'cluster-ratio-t',
  'composite-t',
  'composite-chebyshev',
  'kaplan-meier-t',
  'half-limit-t',
  'not-supported',
]);

function strataWords(setup: StudySetup): string {
  const strata = setup.strata ?? [];
  const total = strata.reduce((t, s) => t + s.weight, 0);
  return strata
    .map(
      (s) =>
        `${s.name}: weight ${fmt(s.weight)} (${pct(s.weight / total)})${s.cost !== undefined ? `, effort per entry ${fmt(s.cost)}` : ''}${s.population !== undefined ? `, ${s.population} units` : ''}`,
    )
    .join('; ');
}

/** The sampling design in words (strata, primary units, composites), from the setup and the entries. */
export function designWords(bundle: Bundle): string {
  const setup = bundle.study.setup;
  if (setup.design === 'composite')
    return 'replicate composites (incremental samples): one entry per composite';
  const clusters = new Set(
    countedEntries(bundle.events)
      .map((e) => e.cluster)
      .filter((c) => c !== undefined),
  ).size;
  const strata = setup.strata?.length ?? 0;
  const units = clusters > 0 ? `, entries grouped in ${clusters} primary units (transects, rooms)` : '';
  if (strata > 0) return `stratified random sample, ${strata} strata${units}`;
  if (clusters > 0) return `primary units as replicates: ${clusters} units (transects, rooms)`;
  return 'simple random sample (entries independent)';
}

function estimateWords(a: Assessment, setup: StudySetup): string {
  const d = a.details;
  const num = (k: string) => (typeof d[k] === 'number' ? (d[k] as number) : null);
  switch (a.method) {
    case 'stratified-t':
      return `the stratified mean (each stratum’s mean weighted by its share; Cochran 1977, ch. 5) over the ${setup.strata?.length ?? 0} declared strata, from ${a.n} counted entries`;
    case 'cluster-ratio-t':
      return `the ratio mean (sum of the values over the number of entries, with the ${num('primaryUnits') ?? '?'} primary units as the replicates; Cochran 1977, ch. 9) of the ${a.n} counted entries`;
    case 'composite-t':
    case 'composite-chebyshev':
      return `the mean of the ${a.n} replicate composites`;
    case 'kaplan-meier-t':
      return `the Kaplan–Meier mean (Helsel 2012) of the ${a.n} counted results, ${num('nonDetects') ?? 0} of them below a reporting limit`;
    case 'half-limit-t':
      return `the mean of the ${a.n} counted results with the ${num('substituted') ?? 0} non-detects set to half their reporting limit (substitution, as chosen for this study)`;
    case 'not-supported':
      return `not given: non-detects inside strata, primary units or composites are not supported (${a.n} counted entries)`;
    default:
      return `the ${setup.kind === 'pass-fail' ? 'proportion of the counted outcome among' : 'mean of'} the ${a.n} counted entries${setup.kind === 'count' ? ' (per plot)' : ''}`;
  }
}

interface ChartPoint {
  n: number;
  estimate: number | null;
  lower: number | null;
  upper: number | null;
}

/**
 * Running interval after each counted entry (at most ~200 points, evenly spread, always the last), by the
 * same assessment as the result: design-aware (src/design) once the study's design applies to the entries
 * so far (declared strata or composites; any entry with a primary unit or below a reporting limit), the
 * simple per-entry assessment before that.
 */
export function runningInterval(bundle: Bundle): ChartPoint[] {
  const setup = bundle.study.setup;
  const points = pointsOf(bundle.events);
  const step = Math.max(1, Math.ceil(points.length / 200));
  const summary = new RunningSummary();
  const values: number[] = [];
  const out: ChartPoint[] = [];
  // the same test as usesDesign (src/design/index.ts), kept incrementally
  let design = (setup.strata !== undefined && setup.strata.length > 0) || setup.design === 'composite';
  points.forEach((p, i) => {
    summary.add(p);
    if (!p.censored) values.push(p.value);
    if (p.cluster !== undefined || p.censored === true) design = true;
    const n = i + 1;
    if (n % step !== 0 && n !== points.length) return;
    const a = design
      ? assessDesign(points.slice(0, n), setup)
      : assessSummary(summary, setup, values, { projection: false });
    out.push({ n, estimate: a.estimate, lower: a.lower, upper: a.upper });
  });
  return out;
}

function chartSvg(points: ChartPoint[], setup: StudySetup): string {
  const W = 640;
  const H = 260;
  const L = 56;
  const R = 12;
  const T = 12;
  const B = 36;
  // a one-sided bound is drawn as a band from the estimate to the bound
  const finite = points
    .filter((p) => p.estimate !== null && (p.lower !== null || p.upper !== null))
    .map((p) => ({
      n: p.n,
      estimate: p.estimate as number,
      lower: p.lower ?? (p.estimate as number),
      upper: p.upper ?? (p.estimate as number),
    }));
  if (finite.length === 0)
    return '<p class="muted">No interval yet: too few counted entries to draw the running interval.</p>';
  let lo = Math.min(...finite.map((p) => p.lower));
  let hi = Math.max(...finite.map((p) => p.upper));
  const limit = setup.target?.kind === 'limit' ? setup.target.value : null;
  if (limit !== null) {
    lo = Math.min(lo, limit);
    hi = Math.max(hi, limit);
  }
  if (hi === lo) {
    hi += 1;
    lo -= 1;
  }
  const pad = (hi - lo) * 0.05;
  lo -= pad;
  hi += pad;
  const nMax = Math.max(...points.map((p) => p.n), 2);
  const x = (n: number) => L + ((n - 1) / (nMax - 1)) * (W - L - R);
  const y = (v: number) => T + ((hi - v) / (hi - lo)) * (H - T - B);
  const f = (v: number) => v.toFixed(1);
  const band = `${finite.map((p) => `${f(x(p.n))},${f(y(p.upper))}`).join(' ')} ${[...finite]
    .reverse()
    .map((p) => `${f(x(p.n))},${f(y(p.lower))}`)
    .join(' ')}`;
  const line = finite.map((p) => `${f(x(p.n))},${f(y(p.estimate))}`).join(' ');
  const ticks = [lo + pad, (lo + hi) / 2, hi - pad];
  const parts = [
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" width="100%" role="img" aria-label="Running estimate and interval against the number of entries">`,
    `<rect x="${L}" y="${T}" width="${W - L - R}" height="${H - T - B}" fill="none" stroke="#999"/>`,
    `<polygon points="${band}" fill="#9ec3e6" fill-opacity="0.6" stroke="none"/>`,
    `<polyline points="${line}" fill="none" stroke="#17324d" stroke-width="2"/>`,
  ];
  if (limit !== null)
    parts.push(
      `<line x1="${L}" x2="${W - R}" y1="${f(y(limit))}" y2="${f(y(limit))}" stroke="#b00020" stroke-dasharray="6 4"/>`,
      `<text x="${W - R - 4}" y="${f(y(limit) - 4)}" text-anchor="end" font-size="11" fill="#b00020">limit ${esc(fmt(limit))}</text>`,
    );
  for (const t of ticks)
    parts.push(
      `<text x="${L - 6}" y="${f(y(t) + 4)}" text-anchor="end" font-size="11">${esc(fmt(t))}</text>`,
    );
  parts.push(
    `<text x="${L}" y="${H - 18}" font-size="11">1</text>`,
    `<text x="${W - R}" y="${H - 18}" text-anchor="end" font-size="11">${nMax}</text>`,
    `<text x="${(L + W - R) / 2}" y="${H - 4}" text-anchor="middle" font-size="12">counted entries (n)</text>`,
    '</svg>',
  );
  return parts.join('\n');
}

function row(label: string, value: string): string {
  return `<tr><th scope="row">${esc(label)}</th><td>${value}</td></tr>`;
}

const CSS = `
  body { font: 11pt/1.45 system-ui, -apple-system, "Segoe UI", Roboto, sans-serif; color: #111; max-width: 46rem; margin: 1.5rem auto; padding: 0 1rem; }
  h1 { font-size: 1.5rem; margin: 0 0 .25rem; } h2 { font-size: 1.1rem; margin: 1.4rem 0 .4rem; border-bottom: 1px solid #ccc; }
  table { border-collapse: collapse; width: 100%; } th, td { text-align: left; padding: .2rem .5rem .2rem 0; vertical-align: top; }
  th[scope=row] { font-weight: 600; width: 38%; } thead th { border-bottom: 1px solid #999; }
  .verdict { font-size: 1.35rem; font-weight: 700; padding: .5rem .75rem; border: 2px solid #17324d; display: inline-block; }
  .muted { color: #555; } code, .hash { font-family: ui-monospace, Menlo, Consolas, monospace; font-size: .85em; word-break: break-all; }
  ul { padding-left: 1.2rem; }
  @page { size: A4; margin: 15mm; }
  @media print { body { margin: 0; max-width: none; font-size: 10pt; } h2 { break-after: avoid; } table, svg, .keep { break-inside: avoid; } a { color: inherit; text-decoration: none; } }
`;

/** The report page (HTML5 text). */
export function reportHtml(bundle: Bundle, options: ReportOptions): string {
  const { study, events } = bundle;
  const setup = study.setup;
  const a: Assessment = assess(pointsOf(events), setup);
  const counts = logCounts(events);
  const shares = collectorShares(events);
  const dups = likelyDuplicates(events);
  const entries = countedEntries(events);
  const bySeq = new Map(events.map((e) => [e.id, e]));
  const voids = events
    .filter((e) => e.voids !== undefined)
    .map((v) => {
      const target = bySeq.get(v.voids as string);
      return `entry ${target?.seq ?? '?'}${target?.label ? ` (${target.label})` : ''} withdrawn at ${v.at} by ${v.device}: ${v.reason ?? ''}`;
    });
  const first = entries[0]?.at;
  const last = entries[entries.length - 1]?.at;
  const unit = setup.kind === 'measurement' && setup.unit ? ` ${setup.unit}` : '';
  const sidedWords =
    a.sided === 'two'
      ? 'two-sided interval'
      : a.sided === 'upper'
        ? 'one-sided upper bound'
        : 'one-sided lower bound';
  const interval =
    a.sided === 'upper' && a.upper !== null
      ? `at most ${fmt(a.upper)}${unit}`
      : a.sided === 'lower' && a.lower !== null
        ? `at least ${fmt(a.lower)}${unit}`
        : a.sided === 'two' && a.lower !== null && a.upper !== null
          ? `${fmt(a.lower)} to ${fmt(a.upper)}${unit}`
          : 'not available';
  const more =
    a.more !== null
      ? `About ${a.more.atLeast ? 'at least ' : ''}${a.more.likely} more (likely ${a.more.low}–${a.more.high}).`
      : '';

  const setupRows = [
    row('Data kind', esc(kindWords(setup))),
    setup.outcomeName ? row('Measured / counted', esc(setup.outcomeName)) : '',
    setup.taxon ? row('Taxon', `<i>${esc(setup.taxon)}</i>`) : '',
    row('Target', esc(targetWords(setup.target, setup))),
    row(
      'Confidence level',
      esc(`${pct(setup.level)} (${setup.sided === 'two' ? 'two-sided' : `one-sided, ${setup.sided}`})`),
    ),
    row('Interval method', esc(setup.method ?? 'the data kind’s default')),
    row('Sampling design', esc(designWords(bundle))),
    setup.strata !== undefined && setup.strata.length > 0 ? row('Strata', esc(strataWords(setup))) : '',
    setup.kind === 'measurement'
      ? row(
          'Non-detects (<RL)',
          esc(
            setup.nonDetects === 'half-limit'
              ? 'replaced by half the reporting limit (substitution, as chosen for this study)'
              : 'Kaplan–Meier mean and SD (Helsel 2012)',
          ),
        )
      : '',
    row('Stopping rule', esc(setup.rule)),
    row('Minimum before a verdict', esc(setup.min)),
    setup.population !== undefined ? row('Population / lot size', esc(setup.population)) : '',
    setup.max !== undefined ? row('Planned maximum', esc(setup.max)) : '',
    setup.reportingLimit !== undefined ? row('Reporting limit', esc(`${setup.reportingLimit}${unit}`)) : '',
    setup.samplingProtocol ? row('Sampling protocol', esc(setup.samplingProtocol)) : '',
    row('Study created', esc(study.createdAt)),
    row('Setup version', esc(study.version)),
    study.notes ? row('Notes', esc(study.notes)) : '',
  ].join('\n');

  const recipe = recipeCommands(setup);
  const gaps = recipeGaps(bundle);
  const shareRows = shares
    .map(
      (s) =>
        `<tr><td>${esc(s.device)}</td><td>${s.counted}</td><td>${s.entries - s.counted}</td><td>${s.voids}</td><td>${esc(pct(s.share))}</td></tr>`,
    )
    .join('\n');

  const method = [
    `The estimate is ${esc(estimateWords(a, setup))}.`,
    `The interval is ${esc(a.methodLabel)}, reported as a ${sidedWords} at ${esc(pct(a.level))}${a.level !== setup.level ? ` (the study’s nominal level is ${esc(pct(setup.level))}; the stopping rule reports at its own level)` : ''}.`,
    `Whether there is enough was decided with ${esc(ruleWords(setup.rule))}.`,
    `Measured coverage of this rule: ${options.coverage === null ? 'not yet measured' : esc(options.coverage)}.`,
    options.coverage !== null &&
    setup.rule !== 'sprt' &&
    Math.abs(setup.level * 100 - COVERAGE_SOURCE.nominalPercent) > 1e-9
      ? `(The benchmark ran at ${COVERAGE_SOURCE.nominalPercent} %; this study uses ${esc(pct(setup.level))}.)`
      : '',
    DESIGN_METHODS.has(a.method)
      ? 'That benchmark simulates simple random samples; the coverage of this design-based interval under the stopping rule has not been measured.'
      : '',
    'Voided entries are kept in the log but left out of every figure.',
  ]
    .filter((x) => x !== '')
    .join(' ');

  const exact = [
    ['n', a.n],
    ['estimate', a.estimate],
    ['lower', a.lower],
    ['upper', a.upper],
    ['level', a.level],
  ]
    .map(([k, v]) => `<code>${esc(k)} = ${esc(v === null ? 'null' : String(v))}</code>`)
    .join('<br>');

  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(study.name)} — report</title>
<style>${CSS}</style>
</head>
<body>
<header>
<h1>${esc(study.name)}</h1>
<p class="muted">Sure Enough report · study ${esc(study.id)}${options.generatedAt ? ` · made ${esc(options.generatedAt)}` : ''}</p>
</header>

<section class="keep">
<h2>Result</h2>
<p class="verdict">${esc(a.verdict.status)}</p>
<p>${esc(a.verdict.message)}</p>
<table>
${row('Estimate', esc(`${fmt(a.estimate)}${unit}${setup.kind === 'count' ? ' per plot' : ''}`))}
${row(`Interval (${pct(a.level)}, ${sidedWords})`, esc(interval))}
${more ? row('More needed', esc(more)) : ''}
${row('Counted entries', esc(a.n))}
</table>
</section>

<section>
<h2>Method</h2>
<p>${method}</p>
</section>

<section class="keep">
<h2>Running interval</h2>
${chartSvg(runningInterval(bundle), setup)}
<p class="muted">Line: the estimate after each counted entry; band: its ${a.sided === 'two' ? 'interval' : 'bound (from the estimate to the bound)'} as reported at that point, by the same method as the result${DESIGN_METHODS.has(a.method) ? ' (the design-based estimate wherever the design applies to the entries so far)' : ''}.</p>
</section>

<section class="keep">
<h2>Setup</h2>
<table>
${setupRows}
</table>
</section>

<section class="keep">
<h2>Entries</h2>
<p>${counts.entries} entries, of which ${counts.counted} counted and ${counts.voided} voided (${counts.voidRecords} void record${counts.voidRecords === 1 ? '' : 's'}).${first ? ` First counted entry ${esc(first)}, last ${esc(last)}.` : ''}</p>
<table>
<thead><tr><th>Collector (device)</th><th>Counted</th><th>Voided</th><th>Void records</th><th>Share of counted</th></tr></thead>
<tbody>
${shareRows}
</tbody>
</table>
${
  voids.length
    ? `<p><strong>Voids</strong> (entries withdrawn; kept in the log, left out of the figures):</p><ul>${voids.map((v) => `<li>${esc(v)}</li>`).join('')}</ul>`
    : ''
}
${
  dups.length
    ? `<p><strong>Likely duplicates</strong> (same label from two devices; both kept):</p><ul>${dups
        .map(
          (d) =>
            `<li>${esc(d.label)}${d.stratum !== undefined ? ` (stratum ${esc(d.stratum)})` : ''}${d.cluster !== undefined ? ` (cluster ${esc(d.cluster)})` : ''}: ${d.devices.map(esc).join(', ')}</li>`,
        )
        .join('')}</ul>`
    : ''
}
</section>

${a.warnings.length ? `<section class="keep"><h2>Warnings</h2><ul>${a.warnings.map((w) => `<li>${esc(w)}</li>`).join('')}</ul></section>` : ''}

<section class="keep">
<h2>Cautions</h2>
<ul>${CAUTIONS.map((c) => `<li>${esc(c)}</li>`).join('')}</ul>
</section>

<section class="keep">
<h2>Check and reproduce</h2>
<table>
${row('SHA-256 of the event log', `<span class="hash">${esc(eventLogHash(events))}</span>`)}
${row('Bundle checksum (setup and log)', `<span class="hash">${esc(bundle.checksum.value)}</span>`)}
</table>
<p>Anyone holding the study bundle can check these (the recipe is in the bundle schema) and reproduce the figures: save the bundle as <code>study.bundle.json</code> and run</p>
<p><code class="recipe">${esc(recipe[0])}</code><br><code class="recipe">${esc(recipe[1])}</code></p>
<p>${gaps.length === 0 ? 'The first command writes the counted entries in log order (non-detects as <code>&lt;RL</code>, with their stratum and primary unit); the second prints the figures below exactly.' : `The command line cannot reproduce this study exactly: ${esc(gaps.join('; '))}.`}</p>
<p>${exact}</p>
</section>
</body>
</html>
`;
}
