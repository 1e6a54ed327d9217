// @vitest-environment happy-dom
// The same study reads the same on the phone's report screen and in the report file: the estimate, the
// interval, the target and the confidence words of the screen (rendered against fake-indexeddb) are found in
// the file made from the same stored study and log, for each data kind (pass/fail with a margin and with a
// limit). Outside checks beside it: the means by plain arithmetic here, and the pass/fail Wilson interval
// from scipy 1.17 (`binomtest(3, 20).proportion_ci(0.95, method='wilson')` → 0.0523687, 0.3604189 [derived]).
import 'fake-indexeddb/auto';
import { cleanup, render, screen, waitFor } from '@testing-library/preact';
import { IDBFactory } from 'fake-indexeddb';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { makeBundle } from '../../src/bundle/bundle.ts';
import { reportHtml } from '../../src/export/report.ts';
import type { StudySetup } from '../../src/model/records.ts';
import { ReportScreen } from '../../web/app/screens/report.tsx';
import { resetDbForTests } from '../../web/storage/db.ts';
import { addEntry, listObservations, voidEntry } from '../../web/storage/observations.ts';
import { createStudy, getStudy } from '../../web/storage/studies.ts';

beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});
afterEach(() => cleanup());

const base = { level: 0.95, sided: 'two', rule: 'standard' } as const;
// invented data
const MG = [9.31, 9.24, 9.28, 9.3, 9.26, 9.29, 9.27, 9.25, 9.3, 9.28, 9.29, 9.27];
const PLOTS = [3, 0, 5, 2, 7, 0, 1, 4, 2, 3, 6, 1];
const WELDS = [0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 1, 0, 0, 0, 0, 0];

const CASES: [string, StudySetup, number[], RegExp][] = [
  [
    'measurement',
    { ...base, kind: 'measurement', unit: 'mg/L', min: 30, target: { kind: 'margin', value: 0.02 } },
    MG,
    /^margin ± 0\.02 mg\/L$/,
  ],
  [
    'count',
    {
      ...base,
      level: 0.9,
      kind: 'count',
      plotArea: 0.25,
      plotAreaUnit: 'm2',
      min: 30,
      target: { kind: 'relative', value: 0.3 },
    },
    PLOTS,
    /^within ± 30 % of the estimate$/,
  ],
  [
    'pass/fail, margin',
    {
      ...base,
      kind: 'pass-fail',
      outcomeName: 'cracked weld',
      min: 30,
      target: { kind: 'margin', value: 0.05 },
    },
    WELDS,
    /^margin ± 5 percentage points$/,
  ],
  [
    'pass/fail, limit',
    {
      ...base,
      level: 0.955,
      sided: 'upper',
      kind: 'pass-fail',
      outcomeName: 'cracked weld',
      min: 10,
      target: { kind: 'limit', value: 0.25, source: 'note CA-7 (invented)', date: '2026-05-01' },
    },
    WELDS,
    /^limit 25 % cracked weld \(note CA-7 \(invented\), 2026-05-01\)$/,
  ],
];

/** The report file's text as a reader sees it (tags dropped, character references resolved, spaces joined). */
function fileText(html: string): string {
  const doc = new DOMParser().parseFromString(html, 'text/html');
  for (const cell of doc.querySelectorAll('th, td, p, li')) cell.append(' ');
  return (doc.body.textContent ?? '').replace(/\s+/g, ' ');
}

describe('the report screen and the report file word a study the same', () => {
  for (const [name, setup, values, target] of CASES)
    it(name, async () => {
      const s = await createStudy({ name: `Cross ${name}`, setup }, 'phone-A');
      for (const v of values) await addEntry(s.id, { value: v }, 'phone-A');
      // a typo, voided: left out of both surfaces' figures
      const typo = await addEntry(s.id, { value: setup.kind === 'pass-fail' ? 1 : 900 }, 'phone-A');
      await voidEntry(s.id, typo.id, 'keyed twice', 'phone-A');
      render(<ReportScreen id={s.id} />);
      await waitFor(() => screen.getByTestId('report-verdict'));
      const shown = Object.fromEntries(
        ['estimate', 'interval', 'target', 'confidence', 'verdict'].map((k) => [
          k,
          screen.getByTestId(`report-${k}`).textContent ?? '',
        ]),
      );
      const study = (await getStudy(s.id))!;
      const file = fileText(
        await reportHtml(await makeBundle(study, await listObservations(s.id)), { coverage: null }),
      );
      for (const [k, v] of Object.entries(shown)) expect(file, `${k}: “${v}”`).toContain(v);
      expect(shown.target).toMatch(target);

      // the figures themselves, from outside the code
      const mean = values.reduce((t, v) => t + v, 0) / values.length;
      if (setup.kind === 'pass-fail') {
        expect(shown.estimate).toBe(`${(mean * 100).toFixed(1)} % cracked weld`);
        expect(mean).toBe(3 / 20);
      } else {
        // rounded for reading: within half a unit of the last digit shown
        const [digits = ''] = (shown.estimate ?? '').split(' ');
        const d = digits.split('.')[1]?.length ?? 0;
        expect(Math.abs(Number(digits) - mean)).toBeLessThanOrEqual(0.5 * 10 ** -d + 1e-12);
      }
      if (name === 'pass/fail, margin') expect(shown.interval).toBe('5.2 to 36.0 % cracked weld');
      if (name === 'pass/fail, limit') expect(shown.interval).toMatch(/^at most \d+\.\d % cracked weld$/);
      if (name === 'measurement') expect(shown.estimate).toMatch(/ mg\/L$/);
      if (name === 'count') expect(shown.estimate).toMatch(/ per plot$/);
      expect(shown.confidence).toBe(
        name === 'count'
          ? '90 %, two-sided interval'
          : name === 'pass/fail, limit'
            ? '95.5 %, one-sided upper bound'
            : '95 %, two-sided interval',
      );
      // the one cautions text on both
      const cautions = [...document.querySelectorAll('.cautions li')].map((li) => li.textContent ?? '');
      expect(cautions.length).toBeGreaterThan(0);
      for (const c of cautions) expect(file).toContain(c);
    });
});
