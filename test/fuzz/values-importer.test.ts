/**
 * Property-based fuzzing of the values importer (src/validate/parse-values.ts), fast-check 4.10.2.
 *
 * Claims checked (the importer's own documented rules, src/cli/README.md "Input"):
 * - never throws on any text, whatever the data kind;
 * - a refusal lists at least one message, each naming its line (`line N: …`, N a line of the input) or
 *   saying that the input holds no values; at most 20 messages are listed;
 * - a planted malformed line (not a number, NaN, Infinity, 1e309, several numbers on one line, a negative
 *   or fractional count, a pass-fail value other than 0/1, an empty or missing CSV cell, a bad `<RL`)
 *   is refused and the message names exactly that line (≥ 1,000 generated malformed inputs);
 * - whatever is accepted obeys the data kind (finite; counts whole and ≥ 0; pass-fail 0 or 1) and keeps
 *   the value: any finite double written with `String(x)` (and with a decimal comma) reads back as x.
 * Evidence level: derived (the expected line numbers are where the generator planted the fault).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { DataKind } from '../../src/model/types.ts';
import { parseValues } from '../../src/validate/parse-values.ts';

const KINDS: DataKind[] = ['measurement', 'count', 'pass-fail'];
const kindArb = fc.constantFrom(...KINDS);
const NO_VALUES = /^the input holds no values/;
const LINE_MSG = /^line (\d+): \S/;

/** Every refusal message names a real line (or says there is nothing to read). */
function expectClearRefusal(text: string, errors: string[]): void {
  expect(errors.length).toBeGreaterThan(0);
  expect(errors.length).toBeLessThanOrEqual(20);
  const nLines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/).length;
  for (const e of errors) {
    if (NO_VALUES.test(e)) continue;
    const m = LINE_MSG.exec(e);
    expect(m, `message without a line: ${e}`).not.toBeNull();
    const line = Number(m![1]);
    expect(line).toBeGreaterThanOrEqual(1);
    expect(line).toBeLessThanOrEqual(nLines);
  }
}

/** A value that is valid for the kind, written as the crew would type it. */
function goodValue(kind: DataKind): fc.Arbitrary<string> {
  if (kind === 'count') return fc.nat({ max: 500 }).map(String);
  if (kind === 'pass-fail') return fc.constantFrom('0', '1');
  return fc.oneof(
    fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }).map(String),
    fc
      .integer({ min: 0, max: 9999 })
      .map((n) => `${Math.floor(n / 100)},${String(n % 100).padStart(2, '0')}`),
  );
}

/** Text that is not a value under any kind: letters (never the header word), non-ASCII digits, … */
const word = fc
  .tuple(
    fc.constantFrom(
      ...'abcdfghijklmnopqrstuwxyzABCDFGHIJKLMNOPQRSTUWXYZ_?!@$%&*(){}[]/\\=~`\'"é漢'.split(''),
    ),
    fc.string({ unit: fc.constantFrom(...'abcxyz0123456789.-+é '.split('')), maxLength: 12 }),
  )
  .map(([a, b]) => (a + b).trim())
  .filter((s) => !/value/i.test(s) && !/[,;\t]/.test(s));

/** A cell that no data kind accepts. */
const badAnyKind = fc.oneof(
  word,
  fc.constantFrom(
    'NaN',
    'nan',
    'Infinity',
    '-Infinity',
    '+Infinity',
    '1e309',
    '-1e309',
    '2e400',
    '١٢',
    '１２',
    '--5',
    '5-',
    '1.2.3',
    '0x1F',
    '1_000',
    '<',
    '<abc',
    '< ',
    '.',
    '+',
    '-',
    'e5',
  ),
  // several numbers on one line: three or more with commas, or two or more with spaces / semicolons
  fc
    .tuple(
      fc.array(fc.integer({ min: 0, max: 99 }), { minLength: 3, maxLength: 6 }),
      fc.constantFrom(',', ' ', ';'),
    )
    .map(([ns, sep]) => ns.join(sep)),
  fc.array(fc.integer({ min: 0, max: 99 }), { minLength: 2, maxLength: 4 }).map((ns) => ns.join(' ')),
);

/** A cell that is a number but not a value of this kind. */
function badForKind(kind: DataKind): fc.Arbitrary<string> {
  if (kind === 'count')
    return fc.oneof(
      fc.integer({ min: 1, max: 1000 }).map((n) => `-${n}`),
      fc.integer({ min: 0, max: 1000 }).map((n) => `${n}.5`),
      fc.integer({ min: 0, max: 1000 }).map((n) => `${n},25`),
      fc.constantFrom('<1', '<0.5'),
    );
  if (kind === 'pass-fail')
    return fc.oneof(
      fc.integer({ min: 2, max: 1000 }).map(String),
      fc.integer({ min: 1, max: 1000 }).map((n) => `-${n}`),
      fc.constantFrom('0.5', '0,5', '1.0001', '<1'),
    );
  return fc.oneof(
    fc.constantFrom('<0', '<-1', '<-0.5', '<0,0'),
    fc.integer({ min: 1, max: 99 }).map((n) => `<-${n}`),
  );
}

/** Filler lines the importer must skip: blank, comments. */
const filler = fc.constantFrom('', '   ', '# comment', '#value', '\t');

interface Planted {
  kind: DataKind;
  text: string;
  badLine: number;
}

/** A plain one-value-per-line list with exactly one malformed line; returns where it is. */
const plainWithFault: fc.Arbitrary<Planted> = kindArb.chain((kind) =>
  fc
    .record({
      before: fc.array(
        fc.oneof({ weight: 4, arbitrary: goodValue(kind) }, { weight: 1, arbitrary: filler }),
        {
          maxLength: 15,
        },
      ),
      bad: fc.oneof(badAnyKind, badForKind(kind)),
      after: fc.array(fc.oneof({ weight: 4, arbitrary: goodValue(kind) }, { weight: 1, arbitrary: filler }), {
        maxLength: 15,
      }),
      eol: fc.constantFrom('\n', '\r\n', '\r'),
    })
    .map(({ before, bad, after, eol }) => ({
      kind,
      text: [...before, bad, ...after].join(eol),
      badLine: before.length + 1,
    })),
);

/** A CSV with a `value` column and exactly one damaged row (bad cell, empty cell, or the column missing). */
const csvWithFault: fc.Arbitrary<Planted> = kindArb.chain((kind) =>
  fc
    .record({
      sep: fc.constantFrom(',', ';', '\t'),
      column: fc.nat({ max: 2 }),
      width: fc.integer({ min: 3, max: 4 }),
      before: fc.array(goodValue(kind), { maxLength: 10 }),
      after: fc.array(goodValue(kind), { maxLength: 10 }),
      fault: fc.oneof(
        fc.oneof(badAnyKind, badForKind(kind)).map((cell) => ({ cell, short: false })),
        fc.constant({ cell: '', short: false }),
        fc.constant({ cell: '', short: true }),
      ),
    })
    .map(({ sep, column, width, before, after, fault }) => {
      const header = Array.from({ length: width }, (_, i) => (i === column ? 'value' : `col${i}`));
      // a comma-separated file uses a decimal point; quote cells that hold the separator
      const cellText = (v: string) => {
        const t = sep === ',' ? v.replace(',', '.') : v;
        return t.includes(sep) || t.includes('"') ? `"${t.replace(/"/g, '""')}"` : t;
      };
      const row = (v: string) =>
        Array.from({ length: width }, (_, i) => (i === column ? cellText(v) : `x${i}`)).join(sep);
      // a short row at column 0 would be a blank line, which the importer skips by rule
      const badRow =
        fault.short && column > 0
          ? Array.from({ length: column }, (_, i) => `x${i}`).join(sep)
          : row(fault.cell);
      const lines = [header.join(sep), ...before.map(row), badRow, ...after.map(row)];
      return { kind, text: lines.join('\n'), badLine: before.length + 2 };
    }),
);

describe('values importer under fuzzing (fast-check)', () => {
  it('never throws on arbitrary text, and every answer is either clean values or line-named messages', () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.string({ maxLength: 200 }),
          fc.string({ unit: 'grapheme', maxLength: 100 }),
          fc.string({
            unit: fc.constantFrom(...'0123456789.,;-+eE<# \t\n\rvalueVALUE"'.split('')),
            maxLength: 120,
          }),
        ),
        kindArb,
        (text, kind) => {
          const r = parseValues(text, kind);
          if (!r.ok) {
            expectClearRefusal(text, r.errors);
            return;
          }
          expect(r.points.length).toBeGreaterThan(0);
          expect(r.lines).toHaveLength(r.points.length);
          for (const p of r.points) {
            expect(Number.isFinite(p.value)).toBe(true);
            if (kind === 'count') expect(Number.isInteger(p.value) && p.value >= 0).toBe(true);
            if (kind === 'pass-fail') expect([0, 1]).toContain(p.value);
            if (p.censored) {
              expect(kind).toBe('measurement');
              expect(p.value).toBeGreaterThan(0);
            }
          }
        },
      ),
      { numRuns: 1500 },
    );
  });

  it('refuses a list with one malformed line and names that line (1,000 generated inputs)', () => {
    fc.assert(
      fc.property(plainWithFault, ({ kind, text, badLine }) => {
        const r = parseValues(text, kind);
        expect(r.ok, `accepted: ${JSON.stringify(text)}`).toBe(false);
        if (r.ok) return;
        expectClearRefusal(text, r.errors);
        expect(r.errors.some((e) => e.startsWith(`line ${badLine}: `))).toBe(true);
        // only the planted line is faulty
        for (const e of r.errors) expect(e.startsWith(`line ${badLine}: `)).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });

  it('refuses a CSV with one damaged row and names that line (1,000 generated inputs)', () => {
    fc.assert(
      fc.property(csvWithFault, ({ kind, text, badLine }) => {
        const r = parseValues(text, kind);
        expect(r.ok, `accepted: ${JSON.stringify(text)}`).toBe(false);
        if (r.ok) return;
        expectClearRefusal(text, r.errors);
        for (const e of r.errors) expect(e.startsWith(`line ${badLine}: `), e).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });

  it('keeps every accepted value exactly: String(x) and its decimal-comma form read back as x', () => {
    fc.assert(
      fc.property(
        // every double the statistics can square (src/model/value.ts: |x| ≤ 1e150)
        fc.array(fc.double({ min: -1e150, max: 1e150, noNaN: true }), { minLength: 1, maxLength: 30 }),
        fc.boolean(),
        (xs, comma) => {
          const forms = xs.map((x) => (comma ? String(x).replace('.', ',') : String(x)));
          const r = parseValues(forms.join('\n'), 'measurement');
          // a decimal comma followed by exactly three digits (1,234) could be a thousands separator:
          // refused with both readings, never guessed
          const ambiguous = forms.findIndex((f) => /^-?[1-9]\d{0,2},\d{3}$/.test(f));
          if (ambiguous >= 0) {
            expect(r.ok).toBe(false);
            if (!r.ok) expect(r.errors[0]).toContain(`line ${ambiguous + 1}: "${forms[ambiguous]}" could be`);
            return;
          }
          expect(r.ok).toBe(true);
          if (!r.ok) return;
          // -0 is the same reading as 0
          expect(r.points.map((p) => p.value + 0)).toEqual(xs.map((x) => x + 0));
        },
      ),
      { numRuns: 500 },
    );
  });
});
