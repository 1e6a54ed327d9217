// @vitest-environment happy-dom
// The entry pads refuse bad input with a message naming what and where, and save nothing; a failed
// write keeps the typed value in the pad. Rules: web/input/parse.ts (doc block).
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/preact';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { CountPad, MeasurementPad, PassFailPad } from '../../web/app/components/pads.tsx';
import { NOTE_MAX, parseCount, parseMeasurement } from '../../web/input/parse.ts';
import { halfTyped } from '../../web/state/app-state.ts';

afterEach(cleanup);

function setup(
  kind: 'measurement' | 'count',
  onSave = vi.fn(async () => ({ seq: 7 })),
  sep: '.' | ',' = '.',
) {
  if (kind === 'measurement')
    render(<MeasurementPad disabled={false} onSave={onSave} unit="mg/L" sep={sep} />);
  else render(<CountPad disabled={false} onSave={onSave} />);
  const input = screen.getByLabelText(
    kind === 'measurement' ? /Value/ : /Count in this plot/,
  ) as HTMLInputElement;
  const save = screen.getByRole('button', { name: kind === 'measurement' ? 'Save' : /^Save plot/ });
  return { onSave, input, save };
}

const type = (input: HTMLInputElement, text: string) => fireEvent.input(input, { target: { value: text } });
const message = () => screen.getByTestId('pad-msg').textContent ?? '';

/** A write that commits when the test says so. */
function deferredSave() {
  let commit: (v: { seq: number }) => void = () => undefined;
  const onSave = vi.fn(() => new Promise<{ seq: number }>((r) => (commit = r)));
  return { onSave, commit: (v: { seq: number }) => commit(v) };
}

describe('measurement pad: bad input is refused, nothing saved', () => {
  const cases: [string, RegExp][] = [
    ['', /Value: nothing typed yet/],
    ['   ', /Value: nothing typed yet/],
    ['1,2,3', /“1,2,3” has 2 decimal separators/],
    ['1.2,3', /“1.2,3” has 2 decimal separators/],
    ['12a', /“a” at position 3 of “12a”/],
    ['NaN', /“N” at position 1 of “NaN”/],
    ['Infinity', /“I” at position 1 of “Infinity”/],
    ['1e309', /“e” at position 2 of “1e309”/],
    ['1 000', /a space at position 2 of “1 000”/],
    ['5-', /a minus sign may only come first/],
    ['--5', /a minus sign may only come first/],
    ['.', /has no digits/],
    // a point study refuses the comma (a hardware keyboard can type it): never read as a thousands mark
    [
      '1,000',
      /“1,000” could be 1000 or 1\.000; type it without a thousands separator \(this study writes decimals with a point\)/,
    ],
    ['1234567890123456', /16 digits/],
    ['9999999999999', /too large/],
  ];
  for (const [text, expected] of cases) {
    it(`refuses “${text}”`, async () => {
      const { onSave, input, save } = setup('measurement');
      type(input, text);
      fireEvent.click(save);
      await waitFor(() => expect(message()).toMatch(expected));
      expect(message()).toMatch(/Nothing was saved\.$/);
      expect(screen.getByTestId('pad-msg').getAttribute('role')).toBe('alert');
      expect(onSave).not.toHaveBeenCalled();
      expect(input.value).toBe(text);
    });
  }

  it('accepts a decimal comma typed on the on-screen keys (a comma study) and saves 12.5', async () => {
    const { onSave, input } = setup('measurement', undefined, ',');
    for (const k of ['1', '2']) fireEvent.click(screen.getByRole('button', { name: k }));
    fireEvent.click(screen.getByRole('button', { name: 'Decimal comma' }));
    fireEvent.click(screen.getByRole('button', { name: '5' }));
    expect(input.value).toBe('12,5');
    fireEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(onSave).toHaveBeenCalledWith({ value: 12.5 }));
    await waitFor(() => expect(message()).toBe('Saved #7: 12,5 mg/L'));
    expect(screen.getByTestId('pad-msg').getAttribute('data-committed')).toBe('1');
    // the pad clears the saved value in the frame after "Saved #k" is shown
    await waitFor(() => expect(input.value).toBe(''));
  });

  it('refuses a 10,000-character note without shortening it', async () => {
    const { onSave, input, save } = setup('measurement');
    type(input, '3.5');
    fireEvent.click(screen.getByRole('button', { name: 'Note' }));
    const note = screen.getByLabelText('Note for the next entry') as HTMLTextAreaElement;
    const long = 'x'.repeat(10_000);
    fireEvent.input(note, { target: { value: long } });
    fireEvent.click(save);
    await waitFor(() =>
      expect(message()).toMatch(
        /^Note: 10,000 characters; the limit is 500\. Shorten it — nothing was saved\.$/,
      ),
    );
    expect(onSave).not.toHaveBeenCalled();
    expect(note.value).toHaveLength(10_000);
    expect(input.value).toBe('3.5');
  });

  it('a failed write shows its message and keeps the typed value (and the note)', async () => {
    const failing = vi.fn(async () => {
      throw new Error('Not saved: the phone has no storage space left for this app.');
    });
    const { input, save } = setup('measurement', failing);
    type(input, '4.75');
    fireEvent.click(screen.getByRole('button', { name: 'Note' }));
    fireEvent.input(screen.getByLabelText('Note for the next entry'), {
      target: { value: 'by the culvert' },
    });
    fireEvent.click(save);
    await waitFor(() => expect(message()).toMatch(/no storage space/));
    expect(failing).toHaveBeenCalledWith({ value: 4.75, note: 'by the culvert' });
    expect(input.value).toBe('4.75');
    expect((screen.getByLabelText('Note for the next entry') as HTMLTextAreaElement).value).toBe(
      'by the culvert',
    );
    expect(screen.getByTestId('pad-msg').getAttribute('data-committed')).toBeNull();
    expect(halfTyped.get()).toBe(true);
  });

  it('a second tap while the write is in flight saves nothing; "Saving…" shows at once, "Saved" after the commit', async () => {
    const { onSave, commit } = deferredSave();
    const { input, save } = setup('measurement', onSave);
    type(input, '3.5');
    fireEvent.click(save);
    fireEvent.click(save); // the double tap
    expect(onSave).toHaveBeenCalledTimes(1);
    expect(save.textContent).toContain('Saving…');
    expect(screen.getByTestId('pad-msg').getAttribute('data-committed')).toBeNull();
    commit({ seq: 7 });
    await waitFor(() => expect(message()).toBe('Saved #7: 3.5 mg/L'));
    expect(screen.getByTestId('pad-msg').getAttribute('data-committed')).toBe('1');
    expect(save.textContent).not.toContain('Saving');
    await waitFor(() => expect(input.value).toBe(''));
    expect(onSave).toHaveBeenCalledTimes(1);
  });

  it('a key tapped while the write is in flight changes nothing: it never lands in the value being saved', async () => {
    const { onSave, commit } = deferredSave();
    const { input, save } = setup('measurement', onSave);
    type(input, '3.5');
    fireEvent.click(save);
    fireEvent.click(screen.getByRole('button', { name: '4' }));
    fireEvent.click(screen.getByRole('button', { name: 'Delete last character' }));
    expect(input.value).toBe('3.5');
    commit({ seq: 7 });
    await waitFor(() => expect(message()).toBe('Saved #7: 3.5 mg/L'));
    await waitFor(() => expect(input.value).toBe(''));
    expect(onSave).toHaveBeenCalledTimes(1);
  });

  it('is fully disabled while the study loads', () => {
    render(<MeasurementPad disabled={true} onSave={vi.fn()} unit="mg/L" />);
    for (const b of screen.getAllByRole('button')) expect((b as HTMLButtonElement).disabled).toBe(true);
    expect(screen.getByRole('button', { name: 'Loading…' })).toBeTruthy();
  });
});

describe('count pad', () => {
  const cases: [string, RegExp][] = [
    ['', /Count: nothing typed/],
    ['-1', /“-1” is negative/],
    ['-0', /“-0” is negative/],
    ['2,5', /“2,5” has a decimal part/],
    ['2.0', /“2.0” has a decimal part/],
    ['abc', /“a” at position 1 of “abc” is not a digit/],
    ['1e3', /“e” at position 2 of “1e3” is not a digit/],
    ['99999999999', /too large/],
  ];
  for (const [text, expected] of cases) {
    it(`refuses “${text}”`, async () => {
      const { onSave, input, save } = setup('count');
      type(input, text);
      fireEvent.click(save);
      await waitFor(() => expect(message()).toMatch(expected));
      expect(onSave).not.toHaveBeenCalled();
      expect(input.value).toBe(text);
    });
  }

  it('zero is one tap away and is saved as 0', async () => {
    const { onSave } = setup('count');
    fireEvent.click(screen.getByRole('button', { name: 'Save plot: 0' }));
    await waitFor(() => expect(onSave).toHaveBeenCalledWith({ value: 0 }));
  });

  it('+1 / −1 count and never go below zero', async () => {
    const { onSave, input } = setup('count');
    const plus = screen.getByRole('button', { name: 'Plus one' });
    const minus = screen.getByRole('button', { name: 'Minus one' });
    fireEvent.click(minus);
    expect(input.value).toBe('0');
    for (let i = 0; i < 3; i++) fireEvent.click(plus);
    fireEvent.click(minus);
    expect(input.value).toBe('2');
    fireEvent.click(screen.getByRole('button', { name: 'Save plot: 2' }));
    await waitFor(() => expect(onSave).toHaveBeenCalledWith({ value: 2 }));
    await waitFor(() => expect(input.value).toBe('0'));
  });
});

describe('pass/fail pad', () => {
  it('two distinct buttons save 1 for the outcome and 0 for its absence', async () => {
    const onSave = vi.fn(async () => ({ seq: 1 }));
    render(<PassFailPad disabled={false} onSave={onSave} outcome="defect" other="no defect" />);
    fireEvent.click(screen.getByRole('button', { name: 'defect', exact: true }));
    await waitFor(() => expect(onSave).toHaveBeenLastCalledWith({ value: 1 }));
    fireEvent.click(screen.getByRole('button', { name: 'no defect', exact: true }));
    await waitFor(() => expect(onSave).toHaveBeenLastCalledWith({ value: 0 }));
    expect(onSave).toHaveBeenCalledTimes(2);
  });
  it('a tap while a save is in flight is refused (one tap, one item); the next tap after the commit saves', async () => {
    const { onSave, commit } = deferredSave();
    render(<PassFailPad disabled={false} onSave={onSave} outcome="defect" other="no defect" />);
    const yes = screen.getByRole('button', { name: 'defect', exact: true });
    fireEvent.click(yes);
    fireEvent.click(yes);
    expect(onSave).toHaveBeenCalledTimes(1);
    expect(screen.getByText('Saving…')).toBeTruthy();
    commit({ seq: 1 });
    await waitFor(() => expect(message()).toBe('Saved #1: defect'));
    fireEvent.click(yes);
    expect(onSave).toHaveBeenCalledTimes(2);
  });
});

describe('parse rules directly', () => {
  it('numbers: comma or point, sign, limits', () => {
    expect(parseMeasurement('12,5')).toEqual({ ok: true, value: 12.5 });
    expect(parseMeasurement(' -0,25 ')).toEqual({ ok: true, value: -0.25 });
    expect(parseMeasurement('.5')).toEqual({ ok: true, value: 0.5 });
    expect(parseMeasurement('-0')).toEqual({ ok: true, value: 0 });
    expect(parseMeasurement('1e309').ok).toBe(false);
    expect(parseCount('0')).toEqual({ ok: true, value: 0 });
    expect(parseCount('007')).toEqual({ ok: true, value: 7 });
    expect(NOTE_MAX).toBe(500);
  });
});
