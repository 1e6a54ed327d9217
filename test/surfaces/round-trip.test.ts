/**
 * What Sure Enough writes, it reads back: for each data kind and field design, the study's figures on the
 * phone (web/state/session.ts) are what `sure-enough assess` and `replay` print when they read
 * - the study bundle itself (its setup, no flags),
 * - the project's CSV export (src/export/csv.ts) with the report's flags,
 * - the report's values file (src/export/recipe.ts) with the same flags,
 * exactly (the same doubles), with a void, a correction and field notes holding commas, quotes and line
 * breaks in every log (RFC 4180 §2 rules 6–7 quoting). A stratified study with each stratum's number of
 * units, which no flag carries, goes through the bundle; the recipe says so (recipeGaps).
 *
 * The values come from published data sets (named beside each study); what the published figures say about
 * the estimators is checked in test/core. One outside anchor is kept here: Scheaffer, Mendenhall & Ott,
 * Elementary Survey Sampling, Example 5.1, prints the stratified mean 27.675 hours with its finite
 * population correction (test/fixtures/design-stratified.json), which `assess BUNDLE` must print.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { assess } from '../../src/assess/index.ts';
import { makeBundle, serializeBundle } from '../../src/bundle/bundle.ts';
import { countedEntries, pointsOf } from '../../src/bundle/events.ts';
import { commands } from '../../src/cli/commands.ts';
import { type FlagSpec, parseArgs } from '../../src/cli/io.ts';
import { eventsCsv } from '../../src/export/csv.ts';
import { assessArgs, assessInputCsv, recipeGaps } from '../../src/export/recipe.ts';
import type { ObservationRecord, StudyRecord, StudySetup } from '../../src/model/records.ts';
import type { Assessment } from '../../src/model/types.ts';
import { loadCore } from '../../web/core-loader.ts';
import { StudySession } from '../../web/state/session.ts';
import {
  firstDetect,
  heat,
  kicks,
  nonDetectEntries,
  strata,
  strataEntries,
  unitEntries,
} from '../support/published-data.ts';

const STUDY_ID = '6f1c2e0a-4b7d-4c2e-9f3a-1d2e3f4a5b6c';
const id = (n: number) => `00000000-0000-4000-8000-${n.toString(16).padStart(12, '0')}`;
const NOTES = ['wet, soft ground', 'said "about 5"', 'two lines\r\nof note', 'comma, "quote"\nand break', ''];

interface Entry {
  value: number;
  censored?: boolean;
  stratum?: string;
  cluster?: string;
}

/** The entries with field notes, then a void of entry #3 and a correction of entry #5. */
function logOf(entries: readonly Entry[], corrected: Entry): ObservationRecord[] {
  const out: ObservationRecord[] = [];
  const push = (r: Omit<ObservationRecord, 'id' | 'studyId' | 'seq' | 'at' | 'device'>) => {
    const seq = out.length + 1;
    const at = `2026-06-01T${String(8 + Math.floor(seq / 60)).padStart(2, '0')}:${String(seq % 60).padStart(2, '0')}:00+02:00`;
    out.push({ id: id(seq), studyId: STUDY_ID, seq, at, device: 'phone, A', ...r });
  };
  entries.forEach((e, i) => {
    const note = NOTES[i % NOTES.length]!;
    push(note === '' ? { ...e } : { ...e, note, label: `Q${i + 1}` });
  });
  push({ voids: id(3), reason: 'keyed into the wrong plot' });
  push({ voids: id(5), reason: 'corrected: misread, "8" not "3"' });
  push({ ...corrected, corrects: id(5), note: 'corrected\nentry' });
  return out;
}

const base = { level: 0.95, sided: 'two', rule: 'standard', min: 10 } as const;
interface Case {
  name: string;
  setup: StudySetup;
  entries: Entry[];
  corrected: Entry;
  /** replay reads plain sequences only (no strata, primary units, composites or non-detects) */
  replay: boolean;
}

const cases: Case[] = [
  {
    name: 'measurement (ZARR13)',
    setup: { ...base, kind: 'measurement', unit: 'W/m2K', target: { kind: 'margin', value: 0.004 } },
    entries: heat.slice(0, 40).map((value) => ({ value })),
    corrected: { value: heat[40]! },
    replay: true,
  },
  {
    name: 'measurement with non-detects (USEPA 2009 Ex. 15-1)',
    setup: { ...base, kind: 'measurement', unit: 'ln(ug/L)', min: 8, target: { kind: 'limit', value: 4 } },
    entries: [...nonDetectEntries],
    corrected: { value: firstDetect },
    replay: false,
  },
  {
    name: 'count (Bortkiewicz)',
    setup: {
      ...base,
      kind: 'count',
      plotArea: 1,
      plotAreaUnit: 'm2',
      target: { kind: 'precision', value: 0.2 },
    },
    entries: kicks.slice(0, 30).map((value) => ({ value })),
    corrected: { value: 1 },
    replay: true,
  },
  {
    name: 'pass/fail (ZARR13 above 9.26 counted)',
    setup: { ...base, kind: 'pass-fail', outcomeName: 'above 9.26', target: { kind: 'margin', value: 0.08 } },
    entries: heat.slice(0, 80).map((v) => ({ value: v > 9.26 ? 1 : 0 })),
    corrected: { value: heat[80]! > 9.26 ? 1 : 0 },
    replay: true,
  },
  {
    name: 'strata (Scheaffer et al. Ex. 5.1, weights only)',
    setup: {
      ...base,
      kind: 'measurement',
      unit: 'h',
      target: { kind: 'margin', value: 1 },
      strata: strata.map((s) => ({ name: s.name, weight: s.population })),
    },
    entries: [...strataEntries],
    corrected: { value: 30, stratum: strata[0]!.name },
    replay: false,
  },
  {
    name: 'primary units (Scheaffer et al. Ex. 8.1)',
    setup: { ...base, kind: 'measurement', unit: 'USD', target: { kind: 'relative', value: 0.05 } },
    entries: [...unitEntries],
    corrected: { value: unitEntries[4]!.value, cluster: unitEntries[4]!.cluster as string },
    replay: false,
  },
  {
    name: 'replicate composites (upper bound)',
    setup: {
      ...base,
      kind: 'measurement',
      unit: 'mg/kg',
      sided: 'upper',
      min: 3,
      design: 'composite',
      target: { kind: 'limit', value: 40 },
    },
    entries: [12, 10, 14, 11, 13, 15].map((value) => ({ value })),
    corrected: { value: 12.5 },
    replay: false,
  },
];

function studyOf(setup: StudySetup): StudyRecord {
  return { id: STUDY_ID, name: 'Round trip, "check"', createdAt: '2026-06-01T07:00:00Z', setup, version: 1 };
}

const dir = mkdtempSync(join(tmpdir(), 'round-trip-'));
let files = 0;
function write(text: string): string {
  const file = join(dir, `f${++files}`);
  writeFileSync(file, text);
  return file;
}

async function cli(cmd: string, argv: string[]): Promise<Record<string, unknown>> {
  const command = commands[cmd]!;
  const out = await command.run(parseArgs(argv, (command as { flags?: FlagSpec }).flags ?? {}, cmd));
  return JSON.parse(out) as Record<string, unknown>;
}

/** The assess fields that carry the study's figures and words (everything but where the setup came from). */
function figures(a: Assessment): Record<string, unknown> {
  return {
    kind: a.kind,
    n: a.n,
    estimate: a.estimate,
    lower: a.lower,
    upper: a.upper,
    level: a.level,
    sided: a.sided,
    method: a.method,
    verdict: a.verdict.status,
    reason: a.verdict.message,
    more: a.more,
    methodLabel: a.methodLabel,
    details: a.details,
    warnings: a.warnings,
  };
}
const FIGURES = [
  'kind',
  'n',
  'estimate',
  'lower',
  'upper',
  'level',
  'sided',
  'method',
  'verdict',
  'reason',
  'more',
  'methodLabel',
  'details',
  'warnings',
];
const pick = (out: Record<string, unknown>) => Object.fromEntries(FIGURES.map((k) => [k, out[k]]));

beforeAll(async () => {
  await loadCore();
});

describe.each(cases)('$name', ({ setup, entries, corrected, replay }) => {
  const study = studyOf(setup);
  const log = logOf(entries, corrected);
  const phone = () => new StudySession({ ...study }, log).assessment;

  it('assess BUNDLE (its own setup) prints the phone figures exactly', async () => {
    const bundle = write(serializeBundle(await makeBundle(study, log)));
    const out = await cli('assess', [bundle]);
    expect(pick(out)).toEqual(figures(phone()));
    expect(out.setupFrom).toBe('bundle');
    expect(out.input).toBe('bundle');
  });

  it('assess on the CSV export with the report flags prints the phone figures exactly', async () => {
    const b = await makeBundle(study, log);
    expect(recipeGaps(b)).toEqual([]);
    const out = await cli('assess', [write(eventsCsv(b)), ...assessArgs(setup)]);
    expect(pick(out)).toEqual(figures(phone()));
    expect(out.setupFrom).toBe('flags');
    expect(out.input).toBe('export');
  });

  it('assess on the values file with the report flags prints the phone figures exactly', async () => {
    const out = await cli('assess', [
      write(assessInputCsv(await makeBundle(study, log))),
      ...assessArgs(setup),
    ]);
    expect(pick(out)).toEqual(figures(phone()));
    expect(out.input).toBe('csv');
  });

  it.runIf(replay)(
    'replay reads the bundle, the CSV export and the values as the JSON-lines sequence',
    async () => {
      const b = await makeBundle(study, log);
      const values = countedEntries(log).map((e) => e.value as number);
      const flags = assessArgs(setup);
      const command = commands.replay!;
      const lines = await command.run(
        parseArgs([write(`${JSON.stringify({ values })}\n`), ...flags], command.flags),
      );
      const want = JSON.parse(lines) as Record<string, unknown>;
      expect(await cli('replay', [write(serializeBundle(b))])).toEqual({ ...want, setupFrom: 'bundle' });
      expect(await cli('replay', [write(eventsCsv(b)), ...flags])).toEqual({ ...want, setupFrom: 'flags' });
      expect(await cli('replay', [write(assessInputCsv(b)), ...flags])).toEqual({
        ...want,
        setupFrom: 'flags',
      });
    },
  );
});

describe('a bundle carries what flags cannot', () => {
  const setup: StudySetup = {
    ...base,
    kind: 'measurement',
    unit: 'h',
    target: { kind: 'margin', value: 1 },
    strata: strata.map((s) => ({ name: s.name, weight: s.population, population: s.population })),
  };
  const study = studyOf(setup);
  const log = logOf(strataEntries, { value: 30, stratum: strata[0]!.name });

  it("strata with each stratum's number of units: assess BUNDLE gives the phone figures; the recipe says it cannot", async () => {
    const b = await makeBundle(study, log);
    expect(recipeGaps(b).join(' ')).toMatch(/number of units/);
    const out = await cli('assess', [write(serializeBundle(b))]);
    expect(pick(out)).toEqual(figures(new StudySession({ ...study }, log).assessment));
  });

  it('the published data alone (no void or correction) give the printed stratified mean 27.675', async () => {
    const plain = strataEntries.map((e, i) => ({
      id: id(i + 1),
      studyId: STUDY_ID,
      seq: i + 1,
      at: '2026-06-01T08:00:00Z',
      device: 'phone',
      ...e,
    }));
    const out = await cli('assess', [write(serializeBundle(await makeBundle(study, plain)))]);
    // Scheaffer, Mendenhall & Ott, Example 5.1: ȳ_st = 27.7 (27.675 to the data's precision)
    expect(out.estimate as number).toBeCloseTo(27.675, 10);
  });

  it('a flag replaces one setting and keeps the rest (the strata with their units)', async () => {
    const b = await makeBundle(study, log);
    const out = await cli('assess', [write(serializeBundle(b)), '--level', '0.9']);
    expect(out.setupFrom).toBe('bundle+flags');
    expect(pick(out)).toEqual(figures(assess(pointsOf(log), { ...setup, level: 0.9 })));
  });

  it('a flag that contradicts the data kind is refused, naming the flag', async () => {
    const b = write(serializeBundle(await makeBundle(study, log)));
    await expect(cli('assess', [b, '--kind', 'count'])).rejects.toThrow(
      /flag --kind: the bundle holds measurement/,
    );
  });
});
