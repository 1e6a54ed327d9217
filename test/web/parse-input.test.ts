// The pad's number rule and the study's decimal separator: a number whose reading depends on the locale is
// refused, never guessed (ISO 80000-1:2009 §7.3.1: the decimal sign is a comma or a point; neither may
// separate groups of digits).
import { describe, expect, it } from 'vitest';
import { parseMeasurement } from '../../web/input/parse.ts';

describe('parseMeasurement and the decimal separator', () => {
  it('without a study separator, 1,000 and 12.500 are refused with both readings', () => {
    expect(parseMeasurement('1,000')).toEqual({
      ok: false,
      message:
        "Value: “1,000” could be 1000 or 1.000; type it without a thousands separator, or set the study's decimal separator.",
    });
    expect(parseMeasurement('12.500').ok).toBe(false);
    expect(parseMeasurement('4,25')).toEqual({ ok: true, value: 4.25 });
    // a leading zero is never a thousands group: 0,005 is five thousandths on any phone
    expect(parseMeasurement('0,005')).toEqual({ ok: true, value: 0.005 });
  });
  it('a comma study reads 12,500 as 12.5, refuses 1.000, and reads an unambiguous 12.5', () => {
    expect(parseMeasurement('12,500', 'Value', ',')).toEqual({ ok: true, value: 12.5 });
    expect(parseMeasurement('1.000', 'Value', ',')).toEqual({
      ok: false,
      message:
        'Value: “1.000” could be 1000 or 1.000; type it without a thousands separator (this study writes decimals with a comma).',
    });
    expect(parseMeasurement('12.5', 'Value', ',')).toEqual({ ok: true, value: 12.5 });
  });
  it('a point study reads 12.500 as 12.5 and refuses the comma', () => {
    expect(parseMeasurement('12.500', 'Value', '.')).toEqual({ ok: true, value: 12.5 });
    expect(parseMeasurement('1,000', 'Value', '.').ok).toBe(false);
  });
});
