/**
 * One study, every surface: the phone session (web/state/session.ts), the report file (src/export/report.ts),
 * `sure-enough assess` on the report's recipe (export --format values + the study's flags), `sure-enough
 * replay`, and a bundle round trip must give the same figures (to 1e-12) and the same words — for each
 * data kind and each field design, with a void and a correction in every log.
 *
 * The values come from published data sets (named beside each study), not invented; what is checked here is
 * that the surfaces agree with each other. Each estimator's agreement with its published source is checked
 * in test/core (the reference tests).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { assess, RunningAssessment } from '../../src/assess/index.ts';
import { makeBundle, serializeBundle } from '../../src/bundle/bundle.ts';
import { countedEntries, pointsOf } from '../../src/bundle/events.ts';
import { parseBundle } from '../../src/bundle/validate.ts';
import { commands } from '../../src/cli/commands.ts';
import { type FlagSpec, parseArgs } from '../../src/cli/io.ts';
import { assessArgs, assessInputCsv } from '../../src/export/recipe.ts';
import { reportHtml, runningInterval } from '../../src/export/report.ts';
import { esc } from '../../src/export/report-page.ts';
import type { ObservationRecord, StudyRecord, StudySetup } from '../../src/model/records.ts';
import type { Assessment } from '../../src/model/types.ts';
import { estimateWords, intervalWords, targetWords } from '../../src/words/index.ts';
import { loadCore } from '../../web/core-loader.ts';
import { StudySession } from '../../web/state/session.ts';
import composite from '../fixtures/design-composite.json';
import {
  firstDetect,
  heat,
  kicks,
  nonDetectEntries,
  strata,
  strataEntries,
  unitEntries,
} from '../support/published-data.ts';

const STUDY_ID = '3b241101-e2bb-4255-8caf-4136c566a962';
const id = (n: number) => `00000000-0000-4000-8000-${n.toString(16).padStart(12, '0')}`;

interface Entry {
  value: number;
  censored?: boolean;
  stratum?: string;
  cluster?: string;
}

/** A log of the entries, then a void of entry #3 and a correction of entry #5 (void + corrected entry). */
function logOf(entries: readonly Entry[], corrected: Entry): ObservationRecord[] {
  const out: ObservationRecord[] = [];
  const at = (k: number) =>
    `2026-06-01T${String(8 + Math.floor(k / 60)).padStart(2, '0')}:${String(k % 60).padStart(2, '0')}:00Z`;
  const push = (r: Omit<ObservationRecord, 'id' | 'studyId' | 'seq' | 'at' | 'device'>) => {
    const seq = out.length + 1;
    out.push({ id: id(seq), studyId: STUDY_ID, seq, at: at(seq), device: 'phone-A', ...r });
  };
  for (const e of entries) push({ ...e });
  push({ voids: id(3), reason: 'keyed into the wrong plot' });
  push({ voids: id(5), reason: 'corrected: misread the display' });
  push({ ...corrected });
  return out;
}

function studyOf(setup: StudySetup): StudyRecord {
  return { id: STUDY_ID, name: 'Cross-surface check', createdAt: '2026-06-01T07:00:00Z', setup, version: 1 };
}

const base = { level: 0.95, sided: 'two', rule: 'standard', min: 10 } as const;

const cases: { name: string; setup: StudySetup; entries: Entry[]; corrected: Entry; replay: boolean }[] = [
  {
    name: 'measurement, Student t, margin (ZARR13)',
    setup: { ...base, kind: 'measurement', unit: 'W/m2K', target: { kind: 'margin', value: 0.004 } },
    entries: heat.slice(0, 40).map((value) => ({ value })),
    corrected: { value: heat[40]! },
    replay: true,
  },
  {
    name: 'measurement, non-detects (Kaplan–Meier), limit (USEPA 2009 Ex. 15-1)',
    setup: { ...base, kind: 'measurement', unit: 'ln(ug/L)', min: 8, target: { kind: 'limit', value: 4 } },
    entries: [...nonDetectEntries],
    corrected: { value: firstDetect },
    replay: false,
  },
  {
    name: 'count, precision, plot area (Bortkiewicz)',
    setup: {
      ...base,
      kind: 'count',
      plotArea: 1,
      plotAreaUnit: 'm2',
      target: { kind: 'precision', value: 0.05 },
    },
    entries: kicks.slice(0, 120).map((value) => ({ value })),
    corrected: { value: kicks[120]! },
    replay: true,
  },
  {
    name: 'pass/fail, margin (ZARR13 above 9.26 counted)',
    setup: { ...base, kind: 'pass-fail', outcomeName: 'above 9.26', target: { kind: 'margin', value: 0.08 } },
    entries: heat.slice(0, 80).map((v) => ({ value: v > 9.26 ? 1 : 0 })),
    corrected: { value: heat[80]! > 9.26 ? 1 : 0 },
    replay: true,
  },
  {
    name: 'pass/fail, limit (ZARR13 above 9.28 counted)',
    setup: { ...base, kind: 'pass-fail', outcomeName: 'above 9.28', target: { kind: 'limit', value: 0.3 } },
    entries: heat.slice(0, 60).map((v) => ({ value: v > 9.28 ? 1 : 0 })),
    corrected: { value: heat[60]! > 9.28 ? 1 : 0 },
    replay: true,
  },
  {
    name: 'strata (Scheaffer et al. Ex. 5.1)',
    setup: {
      ...base,
      kind: 'measurement',
      unit: 'h',
      target: { kind: 'margin', value: 1 },
      strata: strata.map((s) => ({
        name: s.name,
        weight: s.population,
      })),
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
    name: 'replicate composites, upper bound against a limit (ITRC ISM-1 t-UCL cases)',
    setup: {
      ...base,
      kind: 'measurement',
      unit: 'mg/kg',
      sided: 'upper',
      min: 3,
      design: 'composite',
      target: { kind: 'limit', value: 40 },
    },
    entries: [...composite.cases.flatMap((c) => c.results as number[])].map((value) => ({ value })),
    corrected: { value: (composite.cases[0]!.results as number[])[1]! },
    replay: false,
  },
];

const rel = (a: number | null, b: number | null) => {
  if (a === null || b === null) return a === b;
  return a === b || Math.abs(a - b) <= 1e-12 * Math.max(Math.abs(a), Math.abs(b));
};

function expectSameFigures(got: Partial<Assessment>, want: Assessment): void {
  for (const k of ['estimate', 'lower', 'upper', 'level'] as const)
    expect(rel(got[k] as number | null, want[k]), `${k}: ${got[k]} vs ${want[k]}`).toBe(true);
  expect(got.n).toBe(want.n);
  expect(got.more).toEqual(want.more);
}

async function cli(cmd: string, argv: string[]): Promise<string> {
  const command = commands[cmd]!;
  return command.run(parseArgs(argv, (command as { flags?: FlagSpec }).flags ?? {}, cmd));
}

beforeAll(async () => {
  await loadCore();
});

describe.each(cases)('$name', ({ setup, entries, corrected, replay }) => {
  const study = studyOf(setup);
  const log = logOf(entries, corrected);

  it('the phone session, the batch core and a bundle round trip give the same assessment', async () => {
    const session = new StudySession({ ...study }, log);
    const a = session.assessment;
    expect(a.n).toBe(entries.length - 2 + 1);
    expect(assess(pointsOf(log), setup)).toEqual(a);
    const parsed = await parseBundle(serializeBundle(await makeBundle(study, log)));
    if (!parsed.ok) throw new Error(parsed.problems.join('\n'));
    const again = new StudySession({ ...parsed.bundle.study }, parsed.bundle.events);
    expect(again.assessment).toEqual(a);
    expect(again.series).toEqual(session.series);
  });

  it('entry by entry on the phone (with the void and the correction as they happen) ends where a load ends', () => {
    const live = new StudySession({ ...study }, []);
    for (const r of log) live.apply(r);
    const loaded = new StudySession({ ...study }, log);
    expect(live.assessment).toEqual(loaded.assessment);
  });

  it('the report file shows the same chart and the same words', async () => {
    const session = new StudySession({ ...study }, log);
    const a = session.assessment;
    const bundle = await makeBundle(study, log);
    const chart = runningInterval(bundle);
    expect(chart).toEqual(session.series.map((p) => ({ ...p })));
    const html = await reportHtml(bundle, { coverage: null });
    for (const words of [estimateWords(a, setup), intervalWords(a, setup), targetWords(setup.target, setup)])
      expect(html).toContain(esc(words));
  });

  it('`sure-enough assess` on the report recipe gives the same figures and words', async () => {
    const session = new StudySession({ ...study }, log);
    const a = session.assessment;
    const bundle = await makeBundle(study, log);
    const { mkdtempSync, writeFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { tmpdir } = await import('node:os');
    const file = join(mkdtempSync(join(tmpdir(), 'surfaces-')), 'values.csv');
    writeFileSync(file, assessInputCsv(bundle));
    const out = JSON.parse(await cli('assess', [file, ...assessArgs(setup)])) as Record<string, unknown>;
    expectSameFigures(out as Partial<Assessment>, a);
    expect(out.verdict).toBe(a.verdict.status);
    expect(out.reason).toBe(a.verdict.message);
    expect(out.methodLabel).toBe(a.methodLabel);
    expect(out.warnings).toEqual(a.warnings);
    expect(out.details).toEqual(a.details);
  });

  it.runIf(replay)(
    '`sure-enough replay` stops where the phone would first have said so, with its figures',
    async () => {
      const values = countedEntries(log).map((e) => e.value as number);
      // the replay command reads JSON lines from a file
      const { mkdtempSync, writeFileSync } = await import('node:fs');
      const { join } = await import('node:path');
      const { tmpdir } = await import('node:os');
      const file = join(mkdtempSync(join(tmpdir(), 'surfaces-')), 'sequence.jsonl');
      writeFileSync(file, `${JSON.stringify({ values })}\n`);
      const r = JSON.parse(await cli('replay', [file, ...assessArgs(setup)])) as Record<string, unknown>;
      // the phone, entry by entry, on the same counted values
      const phone = new RunningAssessment(setup);
      let first: Assessment | null = null;
      for (const v of values) {
        const a = phone.add({ value: v });
        if (a.verdict.status !== 'keep going') {
          first = a;
          break;
        }
      }
      const at = first ?? phone.assessment;
      expect(r.stoppedAt).toBe(first === null ? null : first.n);
      expect(r.verdict).toBe(at.verdict.status);
      for (const k of ['estimate', 'lower', 'upper'] as const)
        expect(rel(r[k] as number | null, at[k]), `${k}: ${r[k]} vs ${at[k]}`).toBe(true);
    },
  );
});
