/**
 * The interval the data choose (method auto, src/assess/method-choice.ts): the phone session, `sure-enough
 * assess` on the same values and the report file give the same choice, the same reason and the same words.
 * The values are the scipy-generated samples of test/fixtures/stats-skewed-means.json, whose expected model
 * (the largest of scipy's maximized likelihoods) test/core/stats/skewed-means.test.ts checks.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeBundle } from '../../src/bundle/bundle.ts';
import { commands } from '../../src/cli/commands.ts';
import { type FlagSpec, parseArgs } from '../../src/cli/io.ts';
import { reportHtml } from '../../src/export/report.ts';
import { esc } from '../../src/export/report-page.ts';
import type { ObservationRecord, StudyRecord, StudySetup } from '../../src/model/records.ts';
import { methodChoiceWords } from '../../src/words/index.ts';
import { loadCore } from '../../web/core-loader.ts';
import { StudySession } from '../../web/state/session.ts';
import fixture from '../fixtures/stats-skewed-means.json' with { type: 'json' };

const STUDY_ID = '3b241101-e2bb-4255-8caf-4136c566a962';
const id = (n: number) => `00000000-0000-4000-8000-${n.toString(16).padStart(12, '0')}`;

async function cli(cmd: string, argv: string[]): Promise<string> {
  const command = commands[cmd]!;
  return command.run(parseArgs(argv, (command as { flags?: FlagSpec }).flags ?? {}, cmd));
}

beforeAll(async () => {
  await loadCore();
});

describe.each(fixture.cases.filter((c) => c.values.length >= 29))('$kind, n = $values.length', (c) => {
  const setup: StudySetup = {
    kind: 'measurement',
    level: 0.95,
    sided: 'two',
    rule: 'standard',
    min: 10,
    hotSpotShare: 0.1,
    unit: 'mg/kg',
    target: { kind: 'relative', value: 0.01 },
  };
  const study: StudyRecord = {
    id: STUDY_ID,
    name: 'Choice',
    createdAt: '2026-06-01T07:00:00Z',
    setup,
    version: 1,
  };
  const log: ObservationRecord[] = c.values.map((value, i) => ({
    id: id(i + 1),
    studyId: STUDY_ID,
    seq: i + 1,
    at: `2026-06-01T08:${String(i % 60).padStart(2, '0')}:00Z`,
    device: 'phone-A',
    value,
  }));

  it('the phone and the command line choose the same interval for the same reason', async () => {
    const a = new StudySession({ ...study }, log).assessment;
    expect(a.details.methodChoice).toBeDefined();
    const file = join(mkdtempSync(join(tmpdir(), 'choice-')), 'values.txt');
    writeFileSync(file, `${c.values.join('\n')}\n`);
    const flags = ['--kind', 'measurement', '--target', 'relative:0.01', '--hot-spot-share', '0.1'];
    const out = JSON.parse(await cli('assess', [file, ...flags])) as {
      method: string;
      details: Record<string, unknown>;
    };
    expect(out.details.methodChoice).toEqual(a.details.methodChoice);
    expect(out.method).toBe(a.method);
  });

  it('the report file says the same sentence the screen shows', async () => {
    const a = new StudySession({ ...study }, log).assessment;
    const words = methodChoiceWords(a);
    expect(words).toMatch(/^Interval chosen from the data: /);
    const html = await reportHtml(await makeBundle(study, log), { coverage: null });
    expect(html).toContain(esc(words as string));
  });
});
