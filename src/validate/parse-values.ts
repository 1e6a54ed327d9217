/**
 * Parsing field values from text — one value per line, a CSV with a value column, or the project's own
 * CSV export — into points, with each problem named by its line. Pure (no Node APIs): the command line
 * and the app's import share it. The text is read by the one CSV reader (csv-read.ts, RFC 4180), so a
 * quoted comma, quote or line break inside a note never splits a record.
 *
 * Rules (src/cli/README.md, "Input"): blank lines and lines starting with `#` are ignored; a decimal comma is
 * accepted when the line holds one number (`4,25` = 4.25); `<RL` (e.g. `<0.5`) is a value below a
 * reporting limit (a non-detect, measurements only); pass-fail values are 0 or 1; counts are non-negative
 * integers. A CSV is recognised when the first record is a header with a value column (value-columns.ts;
 * separator `,`, `;` or tab; with `;` or tab a decimal comma inside the cell is accepted).
 * Field designs: a CSV may add `stratum` and `cluster` columns (primary unit: transect, room,
 * composite); a plain line may read `value,stratum` or `value,stratum,cluster` (or `value,,cluster`),
 * recognised when the second field does not start with a digit, sign or point (`4,2` stays 4.2).
 * The project's CSV export (src/export/csv.ts) is read as it is written: only `counted` rows, `censored`
 * = true kept as a non-detect at the reporting limit in the value column.
 * Returns: `{ ok: true, points, lines, table }` (lines = the source line of each point; table = how the
 * text was read, with each point's CSV cells) or `{ ok: false, errors }` with messages such as
 * `line 4: "abc" is not a number`.
 * @example parseValues('# depth\n4,2\n5.1\n', 'measurement') // { ok: true, points: [{ value: 4.2 }, { value: 5.1 }], … }
 */
import type { DataKind, Point } from '../model/types.ts';
import { valueProblem } from '../model/value.ts';
import { type CsvRecord, readCsv } from './csv-read.ts';
import { findTable, type ValueTable } from './value-columns.ts';

export type { ValueTable } from './value-columns.ts';

export type ParseResult =
  | {
      ok: true;
      points: Point[];
      lines: number[];
      table: ValueTable;
      /** Each point's CSV cells (empty arrays for plain value lines), for callers that read more columns. */
      cells: string[][];
    }
  | { ok: false; errors: string[] };

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const COMMA_DECIMAL = /^[+-]?\d*,\d+([eE][+-]?\d+)?$/;
/** `1,000` or `12,500`: one thousand or one; twelve thousand five hundred or twelve and a half. */
const COMMA_THOUSANDS = /^[+-]?[1-9]\d{0,2},\d{3}$/;
/** `3,250,000`: only thousands separators can make sense of it, and they are not allowed. */
const GROUPED = /^[+-]?\d{1,3}(,\d{3}){2,}$/;

/** How a study writes its decimals, when it says so (StudySetup.decimalSeparator). */
export interface ValueOptions {
  decimalSeparator?: '.' | ',';
}
const MAX_ERRORS = 20;

function show(text: string): string {
  const t = text.length > 40 ? `${text.slice(0, 37)}…` : text;
  return JSON.stringify(t);
}

/** A single number from one cell or line, or an error message (without the line prefix). */
function parseNumber(
  raw: string,
  allowCommaDecimal: boolean,
  kind: DataKind,
  separator: ValueOptions['decimalSeparator'],
): number | string {
  const s = raw.trim();
  // counts are whole numbers written with digits only: "1,000" and "1.000" are refused, never guessed
  if (kind === 'count' && /^[+-]?\d{1,3}([.,]\d{3})+$/.test(s))
    return `${show(s)} has a separator; write a count with digits only (e.g. ${s.replace(/[.,]/g, '')})`;
  // a point followed by exactly three digits in a comma study could be a thousands mark there
  if (separator === ',' && /^[+-]?[1-9]\d{0,2}\.\d{3}$/.test(s))
    return `${show(s)} could be ${s.replace('.', '')} or ${s}; write it without a thousands separator (this study writes decimals with a comma)`;
  if (NUMBER.test(s)) return Number(s);
  if (GROUPED.test(s)) return `${show(s)} has thousands separators; write ${s.replace(/,/g, '')}`;
  if (allowCommaDecimal && separator !== ',' && COMMA_THOUSANDS.test(s)) {
    const thousands = s.replace(/,/g, '');
    const decimal = s.replace(',', '.');
    return `${show(s)} could be ${thousands} (comma between thousands) or ${decimal} (decimal comma); write ${thousands} or ${decimal}, or set the study's decimal separator`;
  }
  if (allowCommaDecimal && COMMA_DECIMAL.test(s)) return Number(s.replace(',', '.'));
  const parts = s.split(/[\s,;]+/).filter((p) => p !== '');
  if (parts.length > 1 && parts.every((p) => NUMBER.test(p) || COMMA_DECIMAL.test(p)))
    return `${show(s)} holds more than one number; give one value per line`;
  return `${show(s)} is not a number`;
}

interface Cell {
  text: string;
  stratum?: string;
  cluster?: string;
  /** From the export's `censored` column. */
  censored?: boolean;
}

/** The value cell (and design cells) of one record, or an error (without the line prefix); null = skip. */
function cellOf(rec: CsvRecord, t: ValueTable): Cell | string | null {
  if (t.format === 'lines') {
    // one value per line: the record's fields joined back give the line as typed (`4,2` is 4.2)
    const line = rec.cells.join(',').trim();
    const m = /^([^,;\t]+)[,;\t]([^,;\t]*)(?:[,;\t]([^,;\t]+))?$/.exec(line);
    if (m && !/^\s*[-+.\d]/.test(m[2]!) && (m[2]!.trim() !== '' || m[3] !== undefined)) {
      const c: Cell = { text: m[1]!.trim() };
      if (m[2]!.trim() !== '') c.stratum = m[2]!.trim();
      if (m[3] !== undefined) c.cluster = m[3].trim();
      return c;
    }
    return { text: line };
  }
  const at = (i: number | undefined) => (i === undefined ? '' : (rec.cells[i] ?? '').trim());
  if (t.status !== undefined && at(t.status) !== 'counted') return null;
  if (rec.cells.length <= t.valueColumn) return `has no value in the "${t.valueName}" column`;
  const text = at(t.valueColumn);
  if (text === '') return `the "${t.valueName}" cell is empty`;
  const c: Cell = { text };
  if (at(t.stratum) !== '') c.stratum = at(t.stratum);
  if (at(t.cluster) !== '') c.cluster = at(t.cluster);
  if (t.censored !== undefined) {
    const flag = at(t.censored).toLowerCase();
    if (flag !== '' && flag !== 'true' && flag !== 'false')
      return `the "censored" cell ${show(at(t.censored))} is not true or false`;
    if (flag === 'true') c.censored = true;
  }
  return c;
}

export function parseValues(text: string, kind: DataKind, options: ValueOptions = {}): ParseResult {
  const found = findTable(text);
  if (!found.ok) return { ok: false, errors: [found.error] };
  const { table, records } = found;
  if (table.kind !== undefined && table.kind !== kind)
    return {
      ok: false,
      errors: [
        `line ${records[0]!.line}: the column "${table.valueName}" holds ${table.kind} data, but the data kind is ${kind}`,
      ],
    };
  const points: Point[] = [];
  const where: number[] = [];
  const cells: string[][] = [];
  const errors: string[] = [];
  const body = table.format === 'lines' ? records : records.slice(1);
  for (const rec of body) {
    if (errors.length >= MAX_ERRORS) break;
    const lineNo = rec.line;
    const c = cellOf(rec, table);
    if (c === null) continue;
    if (typeof c === 'string') {
      errors.push(`line ${lineNo}: ${c}`);
      continue;
    }
    let cell = c.text;
    let censored = c.censored === true;
    if (cell.startsWith('<')) {
      censored = true;
      cell = cell.slice(1).trim();
    }
    const v = parseNumber(
      cell,
      table.format === 'lines' || table.separator !== ',',
      kind,
      // a study's separator governs what people type; a machine-written table (the export) uses the point
      table.format === 'lines' ? options.decimalSeparator : undefined,
    );
    if (typeof v === 'string') {
      errors.push(`line ${lineNo}: ${censored ? `"<" must be followed by a reporting limit; ` : ''}${v}`);
      continue;
    }
    const problem = valueProblem(v, kind, censored);
    if (problem !== null) {
      errors.push(`line ${lineNo}: ${problem.startsWith('is ') ? `${show(cell)} ${problem}` : problem}`);
      continue;
    }
    const point: Point = censored ? { value: v, censored: true } : { value: v };
    if (c.stratum !== undefined) point.stratum = c.stratum;
    if (c.cluster !== undefined) point.cluster = c.cluster;
    points.push(point);
    where.push(lineNo);
    cells.push(table.format === 'lines' ? [] : rec.cells);
  }
  if (errors.length > 0) return { ok: false, errors };
  if (points.length === 0)
    return {
      ok: false,
      errors: ['the input holds no values (one value per line, or a CSV with a "value" column)'],
    };
  return { ok: true, points, lines: where, table, cells };
}

/** Re-exported for callers that read CSV cells beside the values (the one reader, csv-read.ts). */
export { readCsv };
