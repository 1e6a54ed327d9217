/**
 * The report's reproduction recipe, run as a reader would: the two commands are taken from the report's
 * HTML, un-escaped and split into words by Python (html.unescape, shlex.split — a POSIX shell tokenizer
 * outside the project), then run through the command line's own `export` and `assess` commands. The
 * printed n, estimate, lower, upper, level and verdict must equal the report's figures exactly, for
 * stratified, clustered, stratified-and-clustered, non-detect (Kaplan–Meier and half-limit), composite,
 * SPRT and simple studies. Evidence: derived (the report and `assess` must agree bit for bit).
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { assess } from '../../../src/assess/index.ts';
import { type Bundle, makeBundle, serializeBundle } from '../../../src/bundle/bundle.ts';
import { pointsOf } from '../../../src/bundle/events.ts';
import { commands } from '../../../src/cli/commands.ts';
import { type FlagSpec, parseArgs } from '../../../src/cli/io.ts';
import { assessFlags, assessInputCsv, recipeGaps, shellWord } from '../../../src/export/recipe.ts';
import { reportHtml, runningInterval } from '../../../src/export/report.ts';
import type { ObservationRecord, StudySetup } from '../../../src/model/records.ts';
import { pythonOracle } from '../../fixtures/python-oracle.ts';
import { entries, study, uuid, voidOf } from '../bundle/make.ts';

// Python's shlex, html and csv, run once and committed (test/fixtures/python-recipe.json)
const python = pythonOracle('recipe');

const dir = mkdtempSync(join(tmpdir(), 'recipe-'));

const MEASURE: Partial<StudySetup> = {
  kind: 'measurement',
  unit: 'mg/kg',
  plotArea: undefined,
  plotAreaUnit: undefined,
  taxon: undefined,
};

/** A bundle from (value, extra) pairs on one device, with a void of the 4th entry (a typo re-keyed). */
async function build(
  setup: Partial<StudySetup>,
  rows: [number, Partial<ObservationRecord>][],
): Promise<Bundle> {
  const st = study(setup);
  const ev = entries(
    st,
    rows.map((r) => r[0]),
    'phone-A',
    2,
    0,
    (i) => rows[i]![1],
  );
  // a mistyped entry, withdrawn: must not reach the figures nor the values file
  const typo: ObservationRecord = { ...ev[3]!, id: uuid(5, 1), value: ev[3]!.value! * 100 };
  const all = [...ev.slice(0, 4), typo, ...ev.slice(4)].map((e, i) => ({ ...e, seq: i + 1 }));
  all.push(voidOf(st, typo, all.length + 1, uuid(3, 1), 'keyed ×100'));
  return await makeBundle(st, all);
}

const WET = 'wet meadow';
const DRY = "dry, upland 'north'";
const stratified = await build(
  {
    ...MEASURE,
    target: { kind: 'margin', value: 2 },
    strata: [
      { name: WET, weight: 0.6, cost: 2 },
      { name: DRY, weight: 0.4 },
    ],
  },
  [12.1, 8.2, 14.3, 9.1, 11.8, 7.6, 13.9, 8.8, 12.7, 9.4, 15.2, 8.0, 13.1].map((v, i) => [
    v,
    { stratum: i % 2 === 0 ? WET : DRY },
  ]),
);

const transects: [number, string][] = [
  [3, 'T1'],
  [5, 'T1'],
  [2, 'T1'],
  [4, 'T1'],
  [0, 'T2'],
  [1, 'T2'],
  [1, 'T2'],
  [0, 'T2'],
  [6, 'T3'],
  [8, 'T3'],
  [5, 'T3'],
  [7, 'T3'],
  [2, 'T4'],
  [2, 'T4'],
  [3, 'T4'],
  [1, 'T4'],
  [4, 'T 5'],
  [3, 'T 5'],
  [5, 'T 5'],
];
const clustered = await build(
  {},
  transects.map(([v, c]) => [v, { cluster: c }]),
);
const stratifiedClustered = await build(
  {
    strata: [
      { name: 'north', weight: 3.5, cost: 1.5 },
      { name: 'south', weight: 1.25, cost: 4 },
    ],
  },
  transects.map(([v, c], i) => [
    v + (i % 3),
    { cluster: c, stratum: c === 'T1' || c === 'T3' || c === 'T 5' ? 'north' : 'south' },
  ]),
);
const ND: [number, boolean][] = [
  [0.8, false],
  [0.5, true],
  [1.9, false],
  [2.4, false],
  [0.5, true],
  [3.1, false],
  [1.2, false],
  [1.0, true],
  [2.7, false],
  [1.6, false],
  [0.9, false],
  [2.2, false],
];
const ndRows = ND.map(([v, c]): [number, Partial<ObservationRecord>] => [v, c ? { censored: true } : {}]);
const kaplanMeier = await build(
  { ...MEASURE, target: { kind: 'limit', value: 3, source: 'soil guideline', date: '2024-01-01' } },
  ndRows,
);
const halfLimit = await build(
  { ...MEASURE, target: { kind: 'relative', value: 0.3 }, nonDetects: 'half-limit', reportingLimit: 0.5 },
  ndRows,
);
const composite = await build(
  {
    ...MEASURE,
    design: 'composite',
    sided: 'upper',
    target: { kind: 'limit', value: 60 },
    method: 'chebyshev',
  },
  [41, 55, 48, 52].map((v) => [v, {}]),
);
const sprt = await build(
  {
    rule: 'sprt',
    target: { kind: 'limit', value: 2 },
    sprt: { alpha: 0.05, beta: 0.1, lowerBound: 1.5, upperBound: 2.5, maxN: 200 },
    max: 200,
    planning: { negBinomialK: 2, taylorA: 1.8, taylorB: 1.3 },
  },
  [1, 0, 2, 1, 0, 1, 3, 0, 1, 1, 0, 2, 1, 0, 0, 1, 2, 0, 1, 1].map((v) => [v, {}]),
);
const passFail = await build(
  {
    kind: 'pass-fail',
    plotArea: undefined,
    plotAreaUnit: undefined,
    taxon: undefined,
    unit: undefined,
    method: 'wilson',
    population: 500,
    sided: 'upper',
    level: 0.9,
    min: 5,
    target: { kind: 'margin', value: 0.08 },
  },
  [0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0].map((v) => [v, {}]),
);

const CASES: [string, Bundle, string][] = [
  ['stratified measurements (names with a space, a comma and a quote; costs)', stratified, 'stratified-t'],
  ['counts on transects (primary units)', clustered, 'cluster-ratio-t'],
  ['stratified transects', stratifiedClustered, 'stratified-t'],
  ['non-detects, Kaplan–Meier, limit target', kaplanMeier, 'kaplan-meier-t'],
  ['non-detects, half-limit substitution', halfLimit, 'half-limit-t'],
  ['replicate composites, Chebyshev upper bound', composite, 'composite-chebyshev'],
  ['SPRT with planning coefficients and a maximum', sprt, ''],
  ['pass/fail, finite lot, one-sided, level 0.9', passFail, ''],
];

/** The recipe's commands as argv words: html.unescape + shlex.split in Python. */
function recipeWords(html: string): string[][] {
  const codes = [...html.matchAll(/<code class="recipe">([\s\S]*?)<\/code>/g)].map((m) => m[1]!);
  const out = python(
    'import sys,json,html,shlex\nprint(json.dumps([shlex.split(html.unescape(c)) for c in json.load(sys.stdin)]))',
    JSON.stringify(codes),
  );
  return JSON.parse(out);
}

/** Runs one recipe command like a shell in `dir`: `sure-enough CMD ARGS [> FILE]`. */
async function runRecipe(words: string[], files: Record<string, string>): Promise<string> {
  expect(words[0]).toBe('sure-enough');
  const gt = words.indexOf('>');
  const argv = (gt >= 0 ? words.slice(2, gt) : words.slice(2)).map((w) => (w in files ? files[w]! : w));
  const command = commands[words[1]!]!;
  const out = await command.run(parseArgs(argv, (command as { flags?: FlagSpec }).flags ?? {}, words[1]));
  if (gt >= 0) writeFileSync(files[words[gt + 1]!] ?? join(dir, words[gt + 1]!), out);
  return out;
}

/** The report's exact figures (`<code>name = value</code>`). */
function exactFigures(html: string): Record<string, number | null> {
  const out: Record<string, number | null> = {};
  for (const m of html.matchAll(/<code>(n|estimate|lower|upper|level) = ([^<]*)<\/code>/g))
    out[m[1]!] = m[2] === 'null' ? null : Number(m[2]);
  return out;
}

describe("the report's recipe reproduces its figures with sure-enough assess", () => {
  for (const [name, bundle, method] of CASES)
    it(name, async () => {
      const html = await reportHtml(bundle, { coverage: null });
      expect(recipeGaps(bundle)).toEqual([]);
      expect(html).toContain('the second prints the figures below exactly');
      const [exportCmd, assessCmd, bundleCmd] = recipeWords(html) as [string[], string[], string[]];
      expect(bundleCmd).toEqual(['sure-enough', 'assess', 'study.bundle.json']);
      const files = {
        'study.bundle.json': join(dir, `${name.length}-${method}.bundle.json`),
        'values.csv': join(dir, `${name.length}-${method}-values.csv`),
      };
      writeFileSync(files['study.bundle.json'], serializeBundle(bundle));
      await runRecipe(exportCmd, files);
      const cli = JSON.parse(await runRecipe(assessCmd, files));
      const fig = exactFigures(html);
      const a = assess(pointsOf(bundle.events), bundle.study.setup);
      if (method) expect(a.method).toBe(method);
      expect(cli.method).toBe(a.method);
      expect(fig.n).toBe(a.n);
      for (const k of ['n', 'estimate', 'lower', 'upper', 'level'] as const) expect(cli[k], k).toBe(fig[k]);
      expect(html).toContain(`<p class="verdict">${cli.verdict}</p>`);
      expect(cli.reason).toBe(a.verdict.message);
      expect(cli.more).toEqual(a.more);
      // the bundle route: assess reads the bundle's own setup and prints the same figures
      const viaBundle = JSON.parse(await runRecipe(bundleCmd, files));
      for (const k of ['n', 'estimate', 'lower', 'upper', 'level'] as const)
        expect(viaBundle[k], k).toBe(fig[k]);
      expect(viaBundle.setupFrom).toBe('bundle');
      // the voided ×100 typo is in the log but not in the values file
      expect(readFileSync(files['values.csv'], 'utf8').split('\r\n')).toHaveLength(a.n + 2);
    });

  it('the design flags are all in the recipe, quoted for the shell', async () => {
    expect(assessFlags(stratified.study.setup)).toBe(
      `--kind measurement --level 0.95 --sided two --target margin:2 --rule standard --min 10 --strata 'wet meadow:0.6;dry, upland '\\''north'\\'':0.4' --cost 'wet meadow:2'`,
    );
    expect(assessFlags(stratifiedClustered.study.setup)).toContain(
      '--strata north:3.5,south:1.25 --cost north:1.5,south:4',
    );
    expect(assessFlags(halfLimit.study.setup)).toContain('--non-detects half-limit');
    expect(assessFlags(composite.study.setup)).toContain(
      '--sided upper --method chebyshev --target limit:60',
    );
    expect(assessFlags(composite.study.setup)).toContain('--design composite');
    expect(assessFlags(sprt.study.setup)).toContain(
      '--max 200 --nb-k 2 --taylor-a 1.8 --taylor-b 1.3 --sprt-alpha 0.05 --sprt-beta 0.1 --sprt-lower 1.5 --sprt-upper 2.5',
    );
    expect(shellWord("it's")).toBe(`'it'\\''s'`);
  });

  it('the values file carries non-detects, strata and primary units; a CSV parser reads it', async () => {
    const rows = pythonCsv(assessInputCsv(stratifiedClustered));
    expect(rows[0]).toEqual(['value', 'stratum', 'cluster']);
    // row 17 = counted entry 17 = transects[16] (4 on T 5) + 16 mod 3
    expect(rows[17]).toEqual(['5', 'north', 'T 5']);
    const nd = pythonCsv(assessInputCsv(kaplanMeier));
    expect(nd[0]).toEqual(['value']);
    expect(nd.slice(1).map((r) => r[0])).toEqual(ND.map(([v, c]) => `${c ? '<' : ''}${v}`));
    const st = pythonCsv(assessInputCsv(stratified));
    expect(st[2]).toEqual(['8.2', DRY]);
  });

  it('what the command line cannot carry is stated in the report', async () => {
    const st = study({
      ...MEASURE,
      strata: [
        { name: 'a', weight: 1, population: 40 },
        { name: ' b', weight: 1 },
      ],
    });
    const b = await makeBundle(
      st,
      entries(st, [1, 2, 3, 4], 'x', 2, 0, (i) => ({ stratum: i < 2 ? 'a' : ' b' })),
    );
    const gaps = recipeGaps(b);
    expect(gaps.join('\n')).toMatch(/stratum "a" has a number of units \(40\)/);
    expect(gaps.join('\n')).toMatch(/stratum name " b" cannot be written/);
    const html = await reportHtml(b, { coverage: null });
    expect(html).toContain('The values file and flags cannot reproduce this study exactly');
    // the bundle route is exact here too: the strata's number of units and names come from the bundle
    const bundleCmd = recipeWords(html)[2]!;
    const file = join(dir, 'gaps.bundle.json');
    writeFileSync(file, serializeBundle(b));
    const viaBundle = JSON.parse(await runRecipe(bundleCmd, { 'study.bundle.json': file }));
    const a = assess(pointsOf(b.events), b.study.setup);
    for (const k of ['n', 'estimate', 'lower', 'upper'] as const) expect(viaBundle[k], k).toBe(a[k]);
  });
});

describe('the running chart uses the design-aware assessment', () => {
  for (const [name, bundle] of CASES)
    it(`${name}: the last chart point is the reported interval`, async () => {
      const run = runningInterval(bundle);
      const a = assess(pointsOf(bundle.events), bundle.study.setup);
      const last = run[run.length - 1]!;
      expect(last.n).toBe(a.n);
      expect(last.estimate).toBe(a.estimate);
      expect(last.lower).toBe(a.lower);
      expect(last.upper).toBe(a.upper);
    });
  it('non-detects: the chart has a Kaplan–Meier band (the simple path gives none with <RL values)', async () => {
    const run = runningInterval(kaplanMeier);
    // limit target, two-sided setup: the bound on the estimate's side (upper here) is the one reported
    expect(run.filter((p) => p.upper !== null).length).toBeGreaterThan(5);
    const html = await reportHtml(kaplanMeier, { coverage: null });
    expect(html).toContain('<polygon points=');
    expect(html).toContain('the design-based estimate wherever the design applies');
  });
  it('a one-sided bound is drawn (band from the estimate to the bound) and shown as "at most"', async () => {
    const html = await reportHtml(composite, { coverage: null });
    expect(html).toContain('<polygon points=');
    const a = assess(pointsOf(composite.events), composite.study.setup);
    expect(a.lower).toBeNull();
    expect(html).toMatch(/at most \d/);
  });
});

function pythonCsv(text: string): string[][] {
  const out = python(
    'import sys,csv,io,json\nraw=sys.stdin.buffer.read().decode("utf-8")\nprint(json.dumps(list(csv.reader(io.StringIO(raw, newline=""), strict=True))))',
    text,
  );
  return JSON.parse(out);
}
