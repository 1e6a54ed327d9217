// Input parsing rules of src/cli/README.md ("Input") — each bad input names its line.
import { describe, expect, it } from 'vitest';
import { parseValues } from '../../../src/validate/parse-values.ts';

describe('parseValues', () => {
  it('one value per line; blank and # lines ignored; decimal comma when the line holds one number', () => {
    const r = parseValues('# site A\n4,25\n\n  5.5 \n-1e-2\n', 'measurement');
    expect(r).toMatchObject({
      ok: true,
      points: [{ value: 4.25 }, { value: 5.5 }, { value: -0.01 }],
      lines: [2, 4, 5],
    });
  });
  it('CSV with a value column (comma, semicolon with decimal comma, quoted cells)', () => {
    expect(parseValues('site,value\nA,1.5\n"B, north",2\n', 'measurement')).toMatchObject({
      ok: true,
      points: [{ value: 1.5 }, { value: 2 }],
    });
    expect(parseValues('plot;Value;note\n1;3,5;x\n', 'measurement')).toMatchObject({
      ok: true,
      points: [{ value: 3.5 }],
    });
  });
  it('<RL is a censored point (measurements only)', () => {
    expect(parseValues('<0.5\n1.2\n', 'measurement')).toMatchObject({
      ok: true,
      points: [{ value: 0.5, censored: true }, { value: 1.2 }],
    });
    expect(parseValues('<1\n', 'count')).toEqual({
      ok: false,
      errors: ['line 1: a value below a reporting limit (<RL) is only allowed for measurements'],
    });
  });
  it.each([
    ['1\n2\n3\nabc\n', 'measurement', 'line 4: "abc" is not a number'],
    ['1,5 2,5\n', 'measurement', 'line 1: "1,5 2,5" holds more than one number; give one value per line'],
    ['0\n1\n2\n', 'pass-fail', 'line 3: "2" is not 0 or 1'],
    ['3\n-1\n', 'count', 'line 2: "-1" is negative'],
    ['3\n2.5\n', 'count', 'line 2: "2.5" is not a whole number'],
    ['# nothing\n\n', 'measurement', 'the input holds no values'],
    ['', 'count', 'the input holds no values'],
    ['value\n1\n\n', 'measurement', null],
  ] as const)('%j (%s) → %s', (text, kind, message) => {
    const r = parseValues(text, kind);
    if (message === null) expect(r.ok).toBe(true);
    else {
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.errors[0]).toContain(message);
    }
  });
});

// A number whose meaning depends on the locale is refused, never guessed: in English "1,000" is one thousand,
// in most of Europe it is one (ISO 80000-1:2009 §7.3.1 allows either the comma or the point as the decimal
// sign and forbids either between groups of digits — it recommends a thin space).
describe('numbers whose reading depends on the locale', () => {
  it.each([
    ['1,000', '1000', '1.000'],
    ['12,500', '12500', '12.500'],
    ['-3,250', '-3250', '-3.250'],
  ])('%s is refused with both readings', (typed, thousands, decimal) => {
    const r = parseValues(`4.1\n${typed}\n`, 'measurement');
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.errors[0]).toBe(
        `line 2: "${typed}" could be ${thousands} (comma between thousands) or ${decimal} (decimal comma); write ${thousands} or ${decimal}, or set the study's decimal separator`,
      );
  });
  it('grouped thousands are refused with the plain number to write', () => {
    const r = parseValues('3,250,000\n', 'measurement');
    expect(r).toEqual({ ok: false, errors: ['line 1: "3,250,000" has thousands separators; write 3250000'] });
  });
  it('an unambiguous decimal comma is still read (4,25 and 0,5)', () => {
    expect(parseValues('4,25\n0,5\n', 'measurement')).toMatchObject({
      ok: true,
      points: [{ value: 4.25 }, { value: 0.5 }],
    });
  });
  it("the study's separator settles it: a comma study reads 12,500 as 12.5; a point study refuses the comma", () => {
    expect(parseValues('12,500\n', 'measurement', { decimalSeparator: ',' })).toMatchObject({
      ok: true,
      points: [{ value: 12.5 }],
    });
    const point = parseValues('12,500\n', 'measurement', { decimalSeparator: '.' });
    expect(point.ok).toBe(false);
    const comma = parseValues('1.000\n', 'measurement', { decimalSeparator: ',' });
    expect(comma.ok).toBe(false);
    if (!comma.ok) expect(comma.errors[0]).toContain('"1.000" could be 1000 or 1.000');
    // one decimal mark that cannot be a thousands mark is read in any study
    expect(parseValues('12.5\n', 'measurement', { decimalSeparator: ',' })).toMatchObject({
      ok: true,
      points: [{ value: 12.5 }],
    });
  });
  it('counts take digits only: 1,000 and 1.000 are refused, not read as 1', () => {
    for (const typed of ['1,000', '1.000']) {
      const r = parseValues(`3\n${typed}\n`, 'count');
      expect(r.ok).toBe(false);
      if (!r.ok)
        expect(r.errors[0]).toBe(
          `line 2: "${typed}" has a separator; write a count with digits only (e.g. 1000)`,
        );
    }
  });
});

describe('magnitude', () => {
  it('a value whose square overflows a double (IEEE 754 binary64, largest ≈ 1.8e308) is refused, not turned into an infinite spread', () => {
    const r = parseValues('4\n1e200\n', 'measurement');
    expect(r).toEqual({
      ok: false,
      errors: [
        'line 2: "1e200" is beyond ±1e150, more than the statistics can square; write it in a larger unit',
      ],
    });
    expect(parseValues('1e150\n2e149\n', 'measurement').ok).toBe(true);
  });
});
