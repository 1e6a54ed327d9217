// @vitest-environment happy-dom
// The setup form's live rule figures (issue 4): for the limit decision the operating characteristic and
// Wald's expected sample sizes shown must be the core's own (sprtOperatingCharacteristic, sprtMaxN), and
// Wald's design identities must show: P(below) = 1 − α at the acceptable value and β at the value to
// catch (Wald 1947, Sequential Analysis, §3.2: L(θ₀) = 1 − α, L(θ₁) = β for the approximate boundaries)
// [read/secondary]; the ASN and truncation for pass/fail 2 % – 8 %, α 0.05, β 0.10 are those of
// test/bench/coverage.md (58.3 / 45.0, truncated at 279) [derived]. Strict is offered for pass/fail only
// (Stein's cost ratio is checked in test/core/stop/strict.test.ts). The field screen lists ruleWarnings.
import 'fake-indexeddb/auto';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/preact';
import { IDBFactory } from 'fake-indexeddb';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  ruleWarnings,
  type StudySetup,
  sprtMaxN,
  sprtModelOf,
  sprtOperatingCharacteristic,
} from '../../src/index.ts';
import { FieldScreen } from '../../web/app/screens/field.tsx';
import { NewStudyScreen, STRICT_NOT_OFFERED } from '../../web/app/screens/new-study.tsx';
import { resetDbForTests } from '../../web/storage/db.ts';
import { createStudy } from '../../web/storage/studies.ts';

beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});
afterEach(() => cleanup());

const byId = (id: string) => document.getElementById(id) as HTMLInputElement;
const type = (id: string, value: string) => fireEvent.input(byId(id), { target: { value } });
const choose = (name: string, label: RegExp) => {
  const radios = Array.from(document.querySelectorAll<HTMLInputElement>(`input[name="${name}"]`));
  const r = radios.find((x) => label.test(x.closest('label')?.textContent ?? ''));
  if (!r) throw new Error(`no ${name} radio ${label}`);
  fireEvent.change(r, { target: { checked: true } });
  fireEvent.click(r);
};

describe('new study: live figures of the chosen rule', () => {
  it('limit decision on pass/fail: OC and ASN are the core’s, with Wald’s identities at the zone edges', async () => {
    render(<NewStudyScreen />);
    choose('kind', /^Pass\/fail/);
    choose('targetKind', /^Decide against a limit/);
    type('f-targetValue', '5');
    choose('rule', /^Limit decision/);
    type('f-sprtLow', '2');
    type('f-sprtHigh', '8');
    const table = await waitFor(() => screen.getByTestId('sprt-preview'));
    const setup: StudySetup = {
      kind: 'pass-fail',
      level: 0.95,
      sided: 'two',
      rule: 'sprt',
      min: 10,
      target: { kind: 'limit', value: 0.05, source: 'x', date: '2000-01-01' },
      sprt: { alpha: 0.05, beta: 0.1, lowerBound: 0.02, upperBound: 0.08 },
    };
    const model = sprtModelOf(setup, []);
    if (model === null) throw new Error('no model');
    const maxN = sprtMaxN(setup, model);
    expect(Number(screen.getByTestId('sprt-max').dataset.max)).toBe(maxN);
    expect(maxN).toBe(279); // test/bench/coverage.md, "truncated at"
    const rows = Array.from(table.querySelectorAll<HTMLTableRowElement>('tbody tr'));
    expect(rows.length).toBeGreaterThanOrEqual(5);
    const thetas = rows.map((r) => Number(r.dataset.theta));
    for (const [i, r] of rows.entries()) {
      const oc = sprtOperatingCharacteristic(model, thetas[i] as number, maxN);
      expect(Math.abs(Number(r.dataset.below) - oc.acceptProbability)).toBeLessThanOrEqual(1e-12);
      expect(Math.abs(Number(r.dataset.asn) - oc.asn)).toBeLessThanOrEqual(1e-9);
    }
    const at = (theta: number) => rows[thetas.findIndex((t) => Math.abs(t - theta) < 1e-12)] as HTMLElement;
    // Wald: L(θ₀) = 1 − α = 95 %, L(θ₁) = β = 10 %; ASN 58.3 at 2 %, 45.0 at 8 % (coverage.md)
    expect(Math.abs(Number(at(0.02).dataset.below) - 0.95)).toBeLessThan(1e-6);
    expect(Math.abs(Number(at(0.08).dataset.below) - 0.1)).toBeLessThan(1e-6);
    expect(at(0.02).textContent).toContain('95 %');
    expect(at(0.08).textContent).toContain('10 %');
    expect(at(0.02).textContent).toContain('58.3');
    expect(at(0.08).textContent).toContain('45.0');
    expect(at(0.05).textContent).toMatch(/limit/);
    // P(below) falls as the true rate rises
    const below = rows.map((r) => Number(r.dataset.below));
    for (let i = 1; i < below.length; i++) expect(below[i]).toBeLessThan(below[i - 1] as number);
    // the warnings shown are the core's for this setup
    const shown = Array.from(screen.queryByTestId('rule-warnings')?.querySelectorAll('li') ?? []).map(
      (li) => li.textContent,
    );
    expect(shown).toEqual(ruleWarnings(setup));
  });

  it('figures follow the form: a wider zone needs fewer observations', async () => {
    render(<NewStudyScreen />);
    choose('kind', /^Count per plot/);
    choose('targetKind', /^Decide against a limit/);
    type('f-targetValue', '2');
    choose('rule', /^Limit decision/);
    type('f-sprtLow', '1.5');
    type('f-sprtHigh', '2.5');
    await waitFor(() => screen.getByTestId('sprt-preview'));
    const max1 = Number(screen.getByTestId('sprt-max').dataset.max);
    type('f-sprtLow', '1');
    type('f-sprtHigh', '3');
    await waitFor(() => expect(Number(screen.getByTestId('sprt-max').dataset.max)).toBeLessThan(max1));
    // counts without k: the Poisson assumption is warned about
    expect(screen.getByTestId('rule-warnings').textContent).toMatch(/Poisson/);
  });

  it('strict is offered for pass/fail items only; for measurements and counts the setup says why', async () => {
    render(<NewStudyScreen />);
    const strictRadio = () =>
      Array.from(document.querySelectorAll<HTMLInputElement>('input[name="rule"]')).find((x) =>
        /^Strict/.test(x.closest('label')?.textContent ?? ''),
      );
    // measurements (the default kind): no strict choice, and the reason in the setup's own words
    expect(strictRadio()).toBeUndefined();
    expect(document.body.textContent).toContain(STRICT_NOT_OFFERED);
    choose('kind', /^Count per plot/);
    expect(strictRadio()).toBeUndefined();
    // pass/fail: strict is there, with its cost beside it
    choose('kind', /^Pass\/fail/);
    type('f-targetValue', '5');
    choose('rule', /^Strict/);
    await waitFor(() => screen.getByTestId('strict-preview'));
    expect(document.body.textContent).not.toContain(STRICT_NOT_OFFERED);
  });
});

describe('field screen: the rule’s known limits', () => {
  it('lists ruleWarnings for the study’s setup', async () => {
    const setup: StudySetup = {
      kind: 'count',
      unit: '1',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      min: 10,
      target: { kind: 'relative', value: 0.2 },
    };
    const s = await createStudy({ name: 'Plot A', setup }, 'dev');
    render(<FieldScreen id={s.id} />);
    const box = await waitFor(() => screen.getByTestId('field-rule-warnings'));
    const items = Array.from(box.querySelectorAll('li')).map((li) => li.textContent);
    expect(items).toEqual(ruleWarnings(setup));
    expect(items.length).toBeGreaterThan(0);
  });
});
