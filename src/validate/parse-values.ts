/**
 * Parsing field values from text — one value per line, or a CSV with a `value` column — into points,
 * with each problem named by its line. Pure (no Node APIs): the command line and the app's import share it.
 *
 * Rules (src/cli/README.md, "Input"): blank lines and lines starting with `#` are ignored; a decimal comma is
 * accepted when the line holds one number (`4,25` = 4.25); `<RL` (e.g. `<0.5`) is a value below a
 * reporting limit (a non-detect, measurements only); pass-fail values are 0 or 1; counts are non-negative
 * integers. A CSV is recognised when the first data line is a header with a `value` column (separator
 * `,`, `;` or tab; with `;` or tab a decimal comma inside the cell is accepted).
 * Field designs (issue 7): a CSV may add `stratum` and `cluster` columns (primary unit: transect, room,
 * composite); a plain line may read `value,stratum` or `value,stratum,cluster` (or `value,,cluster`),
 * recognised when the second field does not start with a digit, sign or point (`4,2` stays 4.2).
 * Returns: `{ ok: true, points, lines }` (lines = the source line of each point) or `{ ok: false, errors }`
 * with messages such as `line 4: "abc" is not a number`.
 * @example parseValues('# depth\n4,2\n5.1\n', 'measurement') // { ok: true, points: [{ value: 4.2 }, { value: 5.1 }] }
 */
import type { DataKind, Point } from '../model/types.ts';

export type ParseResult = { ok: true; points: Point[]; lines: number[] } | { ok: false; errors: string[] };

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const COMMA_DECIMAL = /^[+-]?\d*,\d+([eE][+-]?\d+)?$/;
const MAX_ERRORS = 20;

function show(text: string): string {
  const t = text.length > 40 ? `${text.slice(0, 37)}…` : text;
  return JSON.stringify(t);
}

/** A single number from one cell or line, or an error message (without the line prefix). */
function parseNumber(raw: string, allowCommaDecimal: boolean): number | string {
  const s = raw.trim();
  if (NUMBER.test(s)) return Number(s);
  if (allowCommaDecimal && COMMA_DECIMAL.test(s)) return Number(s.replace(',', '.'));
  const parts = s.split(/[\s,;]+/).filter((p) => p !== '');
  if (parts.length > 1 && parts.every((p) => NUMBER.test(p) || COMMA_DECIMAL.test(p)))
    return `${show(s)} holds more than one number; give one value per line`;
  return `${show(s)} is not a number`;
}

/** One line split into trimmed cells (double quotes group; "" is a quote inside quotes). Shared with `bundle`. */
export function splitCsv(line: string, sep: string): string[] {
  const out: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]!;
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cur += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === sep) {
      out.push(cur);
      cur = '';
    } else cur += ch;
  }
  out.push(cur);
  return out.map((c) => c.trim());
}

function checkKind(value: number, censored: boolean, kind: DataKind): string | null {
  if (!Number.isFinite(value)) return 'is not a finite number';
  if (censored) {
    if (kind !== 'measurement')
      return 'a value below a reporting limit (<RL) is only allowed for measurements';
    if (!(value > 0)) return 'a reporting limit must be above zero';
    return null;
  }
  if (kind === 'pass-fail' && value !== 0 && value !== 1)
    return 'is not 0 or 1 (pass-fail: 1 = the counted outcome, 0 = the other)';
  if (kind === 'count') {
    if (value < 0) return 'is negative; counts are whole numbers ≥ 0';
    if (!Number.isInteger(value)) return 'is not a whole number; counts are whole numbers ≥ 0';
  }
  return null;
}

export function parseValues(text: string, kind: DataKind): ParseResult {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
  const points: Point[] = [];
  const where: number[] = [];
  const errors: string[] = [];
  let csv: { sep: string; column: number; width: number; stratum?: number; cluster?: number } | null = null;
  let seenData = false;
  for (let i = 0; i < lines.length && errors.length < MAX_ERRORS; i++) {
    const lineNo = i + 1;
    const line = lines[i]!.trim();
    if (line === '' || line.startsWith('#')) continue;
    if (!seenData) {
      seenData = true;
      for (const sep of [',', ';', '\t']) {
        const cells = splitCsv(line, sep).map((c) => c.toLowerCase());
        const column = cells.indexOf('value');
        if (column >= 0 && (cells.length > 1 || sep === ',')) {
          csv = { sep, column, width: cells.length };
          if (cells.includes('stratum')) csv.stratum = cells.indexOf('stratum');
          if (cells.includes('cluster')) csv.cluster = cells.indexOf('cluster');
          break;
        }
      }
      if (csv !== null) continue;
      if (/^value$/i.test(line)) {
        csv = { sep: ',', column: 0, width: 1 };
        continue;
      }
    }
    let cell = line;
    let stratum: string | undefined;
    let cluster: string | undefined;
    if (csv === null) {
      const m = /^([^,;\t]+)[,;\t]([^,;\t]*)(?:[,;\t]([^,;\t]+))?$/.exec(line);
      if (m && !/^\s*[-+.\d]/.test(m[2]!) && (m[2]!.trim() !== '' || m[3] !== undefined)) {
        cell = m[1]!.trim();
        if (m[2]!.trim() !== '') stratum = m[2]!.trim();
        if (m[3] !== undefined) cluster = m[3].trim();
      }
    }
    if (csv !== null) {
      const cells = splitCsv(line, csv.sep);
      if (csv.stratum !== undefined && cells[csv.stratum]) stratum = cells[csv.stratum];
      if (csv.cluster !== undefined && cells[csv.cluster]) cluster = cells[csv.cluster];
      if (cells.length <= csv.column) {
        errors.push(`line ${lineNo}: has no value in the "value" column`);
        continue;
      }
      cell = cells[csv.column]!;
      if (cell === '') {
        errors.push(`line ${lineNo}: the "value" cell is empty`);
        continue;
      }
    }
    let censored = false;
    if (cell.startsWith('<')) {
      censored = true;
      cell = cell.slice(1).trim();
    }
    const v = parseNumber(cell, csv === null || csv.sep !== ',');
    if (typeof v === 'string') {
      errors.push(`line ${lineNo}: ${censored ? `"<" must be followed by a reporting limit; ` : ''}${v}`);
      continue;
    }
    const problem = checkKind(v, censored, kind);
    if (problem !== null) {
      errors.push(`line ${lineNo}: ${problem.startsWith('is ') ? `${show(cell)} ${problem}` : problem}`);
      continue;
    }
    const point: Point = censored ? { value: v, censored: true } : { value: v };
    if (stratum !== undefined) point.stratum = stratum;
    if (cluster !== undefined) point.cluster = cluster;
    points.push(point);
    where.push(lineNo);
  }
  if (errors.length > 0) return { ok: false, errors };
  if (points.length === 0)
    return {
      ok: false,
      errors: ['the input holds no values (one value per line, or a CSV with a "value" column)'],
    };
  return { ok: true, points, lines: where };
}
