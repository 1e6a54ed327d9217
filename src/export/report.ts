/**
 * The printable report: one self-contained HTML page (no script, no external resource; print CSS so the
 * browser's "Print → Save as PDF" gives the paper copy). It shows the study setup, the verdict and
 * interval, the method in plain words (interval, stopping rule and the rule's measured coverage), an
 * inline SVG chart of the running interval, the entry count with voids, each collector's share, likely
 * duplicates, warnings, the cautions, the SHA-256 of the event log and the bundle checksum, and the
 * commands that reproduce the numbers (recipe.ts: `sure-enough export --format values` then
 * `sure-enough assess` with the study's flags, strata, design and non-detect method included).
 *
 * The result and the running-interval chart come from the one running assessment of src/assess (the phone's
 * own), so its last point is the reported interval.
 *
 * Every figure, unit, level, target and verdict is worded by src/words, as on the phone's screens (pass/fail
 * in percent of items); the page's HTML pieces (escaping, rows, style, chart) are in report-page.ts.
 * Everything typed by a user (study name, notes, units, labels, device names, reasons) is HTML-escaped there.
 */
import { assess, RunningAssessment } from '../assess/index.ts';
import { type Bundle, eventLogHash } from '../bundle/bundle.ts';
import { collectorShares, countedEntries, likelyDuplicates, logCounts, pointsOf } from '../bundle/events.ts';
import type { StudySetup } from '../model/records.ts';
import type { Assessment } from '../model/types.ts';
import { ruleWarnings } from '../stop/rule-warnings.ts';
import {
  CAUTIONS,
  checkedLevelWords,
  confidenceWords,
  decisionWords,
  doneWords,
  estimateWords,
  intervalWords,
  kindWords,
  levelWords,
  methodChoiceWords,
  methodWords,
  minimumWords,
  moreWords,
  percent,
  plain,
  ruleExplained,
  ruleWords,
  sidedWords,
  targetWords,
  unseenWords,
  valueUnit,
  withUnit,
} from '../words/index.ts';
import { COVERAGE_SOURCE } from './coverage.ts';
import { bundleCommand, recipeCommands, recipeGaps } from './recipe.ts';
import { type ChartPoint, chartSvg, esc, REPORT_CSS, row } from './report-page.ts';

export { CAUTIONS } from '../words/index.ts';
export { assessFlags } from './recipe.ts';
export { escapeHtml } from './report-page.ts';

export interface ReportOptions {
  /**
   * The stopping rule's measured coverage in words (from the coverage benchmark), or null when it has not
   * been measured: the report then says "not yet measured".
   */
  coverage: string | null;
  /** When the report was made (ISO 8601); left out when absent so the page is reproducible. */
  generatedAt?: string;
  /**
   * The decimal separator of the figures in words, as on the study's screens: the phone passes the one it
   * shows (the study's own, else the phone's locale); otherwise the study's own, else a point. The exact
   * figures under "Check and reproduce" always use a point: they are for machines.
   */
  decimalSeparator?: '.' | ',';
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
        `${s.name}: weight ${plain(s.weight)} (${percent(s.weight / total)})${s.cost !== undefined ? `, effort per entry ${plain(s.cost)}` : ''}${s.population !== undefined ? `, ${s.population} units` : ''}`,
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

function estimatorWords(a: Assessment, setup: StudySetup): string {
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

/**
 * The running interval for the chart: the series of the same running assessment the phone keeps (at most
 * SERIES_MAX points, evenly spread, always ending at the last entry), so the chart's last point is the
 * reported interval and the report's chart is the phone's.
 */
export function runningInterval(bundle: Bundle): ChartPoint[] {
  const running = new RunningAssessment(bundle.study.setup, pointsOf(bundle.events));
  return running.series.map((p) => ({ n: p.n, estimate: p.estimate, lower: p.lower, upper: p.upper }));
}

/** The report page (HTML5 text); asynchronous because of the event-log hash (the platform's SHA-256). */
export async function reportHtml(bundle: Bundle, options: ReportOptions): Promise<string> {
  const { study, events } = bundle;
  const logHash = await eventLogHash(events);
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
  const sep = options.decimalSeparator ?? setup.decimalSeparator ?? '.';
  // the measured shortfalls of this rule for this setup (the coverage benchmark), as on the screens
  const ruleLimits = ruleWarnings(setup);
  const more = moreWords(a);
  const done = doneWords(a, sep);
  // a reached verdict says what could still be unseen in its own words (doneWords); otherwise a row does
  const unseen = done === null ? unseenWords(a, sep) : null;

  const setupRows = [
    row('Data kind', esc(kindWords(setup, sep))),
    setup.outcomeName ? row('Measured / counted', esc(setup.outcomeName)) : '',
    setup.taxon ? row('Taxon', `<i>${esc(setup.taxon)}</i>`) : '',
    row('Target', esc(targetWords(setup.target, setup, sep))),
    row('Confidence level', esc(confidenceWords(setup.level, setup.sided, sep))),
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
    row('Stopping rule', esc(ruleWords(setup.rule))),
    row('Minimum before a verdict', esc(minimumWords(a, setup, sep))),
    setup.population !== undefined ? row('Population / lot size', esc(setup.population)) : '',
    setup.max !== undefined ? row('Planned maximum', esc(setup.max)) : '',
    setup.reportingLimit !== undefined
      ? row('Reporting limit', esc(withUnit(plain(setup.reportingLimit, sep), valueUnit(setup))))
      : '',
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
        `<tr><td>${esc(s.device)}</td><td>${s.counted}</td><td>${s.entries - s.counted}</td><td>${s.voids}</td><td>${esc(percent(s.share, sep))}</td></tr>`,
    )
    .join('\n');

  const method = [
    `The estimate is ${esc(estimatorWords(a, setup))}.`,
    `The interval is ${esc(methodWords(a, sep))}, reported as a ${sidedWords(a.sided)} at ${esc(levelWords(a.level, sep))}.`,
    esc(methodChoiceWords(a) ?? ''),
    esc(checkedLevelWords(a, setup, sep) ?? ''),
    `The rule's own account: ${esc(a.verdict.message)}`,
    `Whether there is enough was decided with ${esc(ruleExplained(setup.rule))}.`,
    `Measured coverage of this rule: ${options.coverage === null ? 'not yet measured' : esc(options.coverage)}.`,
    options.coverage !== null &&
    setup.rule !== 'sprt' &&
    Math.abs(setup.level * 100 - COVERAGE_SOURCE.nominalPercent) > 1e-9
      ? `(The benchmark ran at ${COVERAGE_SOURCE.nominalPercent} %; this study uses ${esc(levelWords(setup.level, sep))}.)`
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
<style>${REPORT_CSS}</style>
</head>
<body>
<header>
<h1>${esc(study.name)}</h1>
<p class="muted">Sure Enough report · study ${esc(study.id)}${options.generatedAt ? ` · made ${esc(options.generatedAt)}` : ''}</p>
</header>

<section class="keep">
<h2>Result</h2>
<p class="verdict">${esc(a.verdict.status)}</p>
<p>${esc(decisionWords(a, setup, sep))}</p>
${done ? `<p>${esc(done)}</p>` : ''}
<table>
${row('Estimate', esc(estimateWords(a, setup, sep)))}
${row(`Interval (${confidenceWords(a.level, a.sided, sep)})`, esc(intervalWords(a, setup, sep)))}
${more ? row('More needed', esc(more)) : ''}
${unseen ? row('Could still be unseen', esc(unseen)) : ''}
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
${ruleLimits.length ? `<section class="keep"><h2>Known limits of this rule</h2><ul>${ruleLimits.map((w) => `<li>${esc(w)}</li>`).join('')}</ul></section>` : ''}

<section class="keep">
<h2>Cautions</h2>
<ul>${CAUTIONS.map((c) => `<li>${esc(c)}</li>`).join('')}</ul>
</section>

<section class="keep">
<h2>Check and reproduce</h2>
<table>
${row('SHA-256 of the event log', `<span class="hash">${esc(logHash)}</span>`)}
${row('Bundle checksum (setup and log)', `<span class="hash">${esc(bundle.checksum.value)}</span>`)}
</table>
<p>Anyone holding the study bundle can check these (the recipe is in the bundle schema) and reproduce the figures: save the bundle as <code>study.bundle.json</code> and run</p>
<p><code class="recipe">${esc(recipe[0])}</code><br><code class="recipe">${esc(recipe[1])}</code></p>
<p>${gaps.length === 0 ? 'The first command writes the counted entries in log order (non-detects as <code>&lt;RL</code>, with their stratum and primary unit); the second prints the figures below exactly.' : `The values file and flags cannot reproduce this study exactly: ${esc(gaps.join('; '))}.`}</p>
<p>Exact in every case, since it reads the setup from the bundle itself: <code class="recipe">${esc(bundleCommand())}</code></p>
<p>${exact}</p>
</section>
</body>
</html>
`;
}
