/**
 * What the entry pads accept. Every refusal says what is wrong and where; nothing is ever guessed,
 * rounded or shortened silently.
 *
 * - Measurements: an optional minus, digits, at most one decimal separator (comma or point), at most
 *   15 digits; no letters (so no `e` notation, `NaN`, `Infinity`), no thousands separators, no spaces
 *   inside. Magnitude at most 1e12.
 * - Counts: a whole number from 0 to 1,000,000,000; no sign, no decimal part.
 * - Notes and reasons: free text up to NOTE_MAX / REASON_MAX characters. Longer text is REFUSED with
 *   its length, never truncated, so the user decides what to cut.
 */
export const NOTE_MAX = 500;
export const REASON_MAX = 200;
export const MAX_MAGNITUDE = 1e12;
export const COUNT_MAX = 1_000_000_000;

export type Parsed = { ok: true; value: number } | { ok: false; message: string };

function fail(message: string): Parsed {
  return { ok: false, message };
}

/**
 * `sep`: the study's decimal separator, when known. A comma or point followed by exactly three digits
 * ("1,000", "12.500") could be a thousands mark or a decimal one: read by the study's separator when it is
 * that mark, refused with both readings otherwise (so "1,000" in a point study is never read as 1). Any
 * other single mark can only be a decimal one ("12,5" = 12.5 on any phone) and is read as such.
 */
export function parseMeasurement(raw: string, field = 'Value', sep?: '.' | ','): Parsed {
  const text = raw.trim();
  if (text === '') return fail(`${field}: nothing typed yet. Key in a number, then save.`);
  const bad = /[^0-9.,-]/.exec(text);
  if (bad) {
    const ch = bad[0] === ' ' ? 'a space' : `“${bad[0]}”`;
    return fail(
      `${field}: ${ch} at position ${bad.index + 1} of “${text}” is not allowed. Use digits and one decimal comma or point.`,
    );
  }
  const minus = text.lastIndexOf('-');
  if (minus > 0 || (text.match(/-/g)?.length ?? 0) > 1) {
    return fail(`${field}: a minus sign may only come first (“${text}”).`);
  }
  const seps = text.match(/[.,]/g)?.length ?? 0;
  if (seps > 1) {
    return fail(
      `${field}: “${text}” has ${seps} decimal separators. Use one comma or point, and no thousands separators.`,
    );
  }
  const grouped = /^-?[1-9]\d{0,2}([.,])\d{3}$/.exec(text);
  if (grouped && grouped[1] !== sep) {
    const whole = text.replace(/[.,]/, '');
    const decimal = text.replace(',', '.');
    return fail(
      `${field}: “${text}” could be ${whole} or ${decimal}; type it without a thousands separator${sep === undefined ? ", or set the study's decimal separator" : ` (this study writes decimals with a ${sep === ',' ? 'comma' : 'point'})`}.`,
    );
  }
  const digits = text.replace(/[^0-9]/g, '');
  if (digits.length === 0) return fail(`${field}: “${text}” has no digits.`);
  if (digits.length > 15)
    return fail(`${field}: “${text}” has ${digits.length} digits; at most 15 are kept exactly.`);
  const value = Number(text.replace(',', '.'));
  if (!Number.isFinite(value)) return fail(`${field}: “${text}” is not a number.`);
  if (Math.abs(value) > MAX_MAGNITUDE) return fail(`${field}: “${text}” is too large (at most 10¹²).`);
  return { ok: true, value: Object.is(value, -0) ? 0 : value };
}

export function parseCount(raw: string, field = 'Count'): Parsed {
  const text = raw.trim();
  if (text === '') return fail(`${field}: nothing typed. Zero is a real count — tap 0 or use the counter.`);
  if (text.startsWith('-')) return fail(`${field}: “${text}” is negative; a count is 0 or more.`);
  if (/[.,]/.test(text)) return fail(`${field}: “${text}” has a decimal part; a count is a whole number.`);
  const bad = /[^0-9]/.exec(text);
  if (bad) return fail(`${field}: “${bad[0]}” at position ${bad.index + 1} of “${text}” is not a digit.`);
  const value = Number(text);
  if (!Number.isSafeInteger(value) || value > COUNT_MAX) {
    return fail(`${field}: “${text}” is too large for one plot (at most 1,000,000,000).`);
  }
  return { ok: true, value };
}

export type TextCheck = { ok: true; text: string } | { ok: false; message: string };

export function checkNote(raw: string, field = 'Note', max = NOTE_MAX): TextCheck {
  const text = raw.trim();
  if (text.length > max) {
    return {
      ok: false,
      message: `${field}: ${text.length.toLocaleString('en')} characters; the limit is ${max}. Shorten it — nothing was saved.`,
    };
  }
  return { ok: true, text };
}

/** A void needs a reason (non-empty, at most REASON_MAX). */
export function checkReason(raw: string): TextCheck {
  const t = raw.trim();
  if (t === '') return { ok: false, message: 'Reason: say why this entry no longer counts.' };
  return checkNote(t, 'Reason', REASON_MAX);
}
