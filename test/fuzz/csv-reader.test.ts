/**
 * Property-based fuzzing of the one CSV reader (src/validate/csv-read.ts) against the project's own CSV
 * writer (src/export/rfc4180.ts), fast-check. The rules are RFC 4180 (Shafranovich 2005) §2: records end
 * with CRLF; a field holding a comma, a double quote, CR or LF is enclosed in double quotes; a quote inside
 * is written twice. Claims:
 * - round trip: any table the writer writes (fields with commas, quotes, CR, LF, CRLF, Unicode, `#`,
 *   leading spaces), read back, gives the same rows — with and without a UTF-8 byte-order mark;
 * - each record's line is the line it starts on in the text (1 + the line breaks before it);
 * - hostile text (quotes anywhere, unclosed quotes, text after a closing quote, lone CRs) never throws;
 *   a refusal is one message naming a line of the input, and the input is left as it was;
 * - through the values parser, a planted unclosed quote is refused naming exactly its line.
 * Evidence level: derived (the rows are the generator's; the lines are counted in the written text).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvText } from '../../src/export/rfc4180.ts';
import { readCsv } from '../../src/validate/csv-read.ts';
import { parseValues } from '../../src/validate/parse-values.ts';

const piece = fc.constantFrom(
  ',',
  '"',
  '""',
  '\r\n',
  '\n',
  '\r',
  '#',
  ' ',
  'a',
  'Ω',
  '😀',
  ';',
  '\t',
  '<0.5',
  '4,2',
);
const field = fc.oneof(
  fc.string({ maxLength: 12 }),
  fc.array(piece, { maxLength: 6 }).map((p) => p.join('')),
  fc.string({ unit: 'grapheme', maxLength: 8 }),
);
/** A row the writer can write and RFC 4180 can tell apart from a blank line: two fields or a non-empty one. */
const row = fc.oneof(
  fc.array(field, { minLength: 2, maxLength: 6 }),
  field.filter((f) => f !== '').map((f) => [f]),
);
const table = fc.array(row, { minLength: 1, maxLength: 12 });
const BREAK = /\r\n|\r|\n/g;

describe('readCsv reads back what csvText writes', () => {
  it('same rows, with or without a byte-order mark', () => {
    fc.assert(
      fc.property(table, fc.boolean(), (rows, bom) => {
        const text = (bom ? '\uFEFF' : '') + csvText(rows);
        const r = readCsv(text, ',', { comments: false });
        expect(r.ok).toBe(true);
        if (r.ok) expect(r.records.map((x) => x.cells)).toEqual(rows);
      }),
      { numRuns: 1000 },
    );
  });

  it('each record names the line it starts on', () => {
    fc.assert(
      fc.property(table, (rows) => {
        const text = csvText(rows);
        const r = readCsv(text, ',', { comments: false });
        if (!r.ok) throw new Error(r.error);
        let offset = 0;
        rows.forEach((cells, i) => {
          const before = text.slice(0, offset).match(BREAK)?.length ?? 0;
          expect(r.records[i]!.line).toBe(before + 1);
          offset += csvText([cells]).length;
        });
      }),
      { numRuns: 500 },
    );
  });

  it('a record is numbered by the editor line it starts on, even after a stray break or a comment', () => {
    // found by the values fuzzing below: the file's break is CR, the cell holds LFs; counting back
    // from the record's end named line 0. Editors count every CR, LF and CRLF as a break.
    expect(readCsv('\rE\n\n')).toEqual({ ok: true, records: [{ line: 2, cells: ['E\n\n'] }] });
    expect(readCsv('# a "note\n1\n\n# b\n2,3\r\n4')).toEqual({
      ok: true,
      records: [
        { line: 2, cells: ['1'] },
        { line: 5, cells: ['2', '3\r'] },
        { line: 6, cells: ['4'] },
      ],
    });
  });

  it('a quoted separator, quote and line break (the export note) stay inside one field', () => {
    const text = 'value,note\r\n4.2,"wet, ""soft""\r\nground"\r\n5,\r\n';
    expect(readCsv(text)).toEqual({
      ok: true,
      records: [
        { line: 1, cells: ['value', 'note'] },
        { line: 2, cells: ['4.2', 'wet, "soft"\r\nground'] },
        { line: 4, cells: ['5', ''] },
      ],
    });
  });
});

describe('hostile text', () => {
  const hostile = fc.array(
    fc.oneof(
      piece,
      fc.constantFrom('"x"y', '"open', 'x"y"', '\r', '""""', ',"'),
      fc.string({ maxLength: 4 }),
    ),
    { maxLength: 40 },
  );
  it('never throws; a refusal names a line of the input; the input is unchanged', () => {
    fc.assert(
      fc.property(
        hostile,
        fc.constantFrom(',', ';', '\t') as fc.Arbitrary<',' | ';' | '\t'>,
        (parts, sep) => {
          const text = parts.join('');
          const copy = `${text}`;
          const r = readCsv(text, sep);
          expect(text).toBe(copy);
          if (r.ok) return;
          const m = /^line (\d+): \S/.exec(r.error);
          expect(m, r.error).not.toBeNull();
          const lines = text.replace(/^\uFEFF/, '').split(BREAK).length;
          expect(Number(m![1])).toBeGreaterThanOrEqual(1);
          expect(Number(m![1])).toBeLessThanOrEqual(lines);
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('a planted unclosed quote is refused by the values parser naming its line', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 99 }), { minLength: 1, maxLength: 20 }),
        fc.nat(),
        fc.constantFrom('\n', '\r\n'),
        (values, at, eol) => {
          const lines = ['value', ...values.map(String)];
          const k = 1 + (at % values.length);
          lines[k] = `"${lines[k]}`;
          const r = parseValues(lines.join(eol) + eol, 'count');
          expect(r).toEqual({
            ok: false,
            errors: [`line ${k + 1}: a quoted field is not closed (a " opens it and no " ends it)`],
          });
        },
      ),
      { numRuns: 500 },
    );
  });

  it('text after a closing quote is refused naming its line', () => {
    expect(readCsv('value,note\n1,ok\n2,"wet"ish\n')).toEqual({
      ok: false,
      error: 'line 3: a quoted field goes on after its closing quote (write a " inside quotes as "")',
    });
  });
});
