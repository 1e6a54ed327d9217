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
