/**
 * The one CSV reader of the project: text → records (cells as written, with the line each record starts
 * on), by RFC 4180 (Shafranovich 2005, "Common Format and MIME Type for CSV Files", §2): a field in double
 * quotes may hold the separator, line breaks and doubled quotes (`""` = one `"`); records end with CRLF,
 * LF or CR. A UTF-8 byte-order mark at the start is dropped. The parsing itself is papaparse's (a kept,
 * dependency-free library that runs in the browser and in Node); this module adds what the callers need
 * on top: blank records and `#` comment lines skipped, each record's first line, and a problem named by
 * the line it is on instead of a partial result.
 *
 * Every reader of CSV text in the project (values for `assess`, `replay` and `bundle`, the project's own
 * CSV export read back) goes through here; the writer is src/export/rfc4180.ts.
 *
 * @example readCsv('value,note\r\n4.2,"wet, ""soft"""\r\n') // { ok: true, records: [{ line: 1, cells: ['value', 'note'] }, { line: 2, cells: ['4.2', 'wet, "soft"'] }] }
 */
/// <reference path="./papaparse.d.ts" />
import Papa from 'papaparse';

export interface CsvRecord {
  /** Line (1-based, in the text as given) on which the record starts. */
  line: number;
  /** The fields exactly as written (quotes removed, `""` undone, no trimming). */
  cells: string[];
}

export type CsvRead = { ok: true; records: CsvRecord[] } | { ok: false; error: string };

export type CsvSeparator = ',' | ';' | '\t';

const BREAK = /\r\n|\r|\n/g;

/** Offsets at which each line starts (line 1 at 0), for turning offsets into line numbers. */
function lineStarts(text: string): number[] {
  const starts = [0];
  for (const m of text.matchAll(BREAK)) starts.push(m.index + m[0].length);
  return starts;
}

/** The 1-based line holding offset `at` (binary search over the line starts). */
function lineAt(starts: readonly number[], at: number): number {
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (starts[mid]! <= at) lo = mid;
    else hi = mid - 1;
  }
  return lo + 1;
}

const QUOTE_WORDS: Record<string, string> = {
  MissingQuotes: 'a quoted field is not closed (a " opens it and no " ends it)',
  InvalidQuotes: 'a quoted field goes on after its closing quote (write a " inside quotes as "")',
};

/**
 * Reads CSV text with the given separator. Blank records and records whose first field starts with `#`
 * (comments, the values input's rule) are left out; `{ comments: false }` keeps the `#` records and the
 * records of spaces (a table such as the project's own export, where neither is special), and leaves out
 * only empty lines. A malformed record (an unclosed quote,
 * text after a closing quote) stops the read with `line N: …` naming the line where the quote is.
 */
export function readCsv(
  input: string,
  separator: CsvSeparator = ',',
  options: { comments?: boolean } = {},
): CsvRead {
  const comments = options.comments ?? true;
  const text = input.startsWith('\uFEFF') ? input.slice(1) : input;
  const starts = lineStarts(text);
  const records: CsvRecord[] = [];
  let error: string | null = null;
  // where the next record starts: the previous record's cursor (which includes its line break), moved
  // past the comment lines papaparse skips without a step. Counting from the start, not back from the
  // end, keeps the number right when a cell holds line breaks other than the file's own (a lone CR in
  // an LF file), which are still lines to an editor.
  let next = 0;
  Papa.parse(text, {
    delimiter: separator,
    quoteChar: '"',
    escapeChar: '"',
    header: false,
    dynamicTyping: false,
    skipEmptyLines: false,
    comments: comments ? '#' : false,
    step: (r) => {
      if (error !== null) return;
      const problem = r.errors.find((e) => e.type === 'Quotes') ?? r.errors[0];
      let start = next;
      next = r.meta.cursor;
      const linebreak = r.meta.linebreak;
      while (comments && text.startsWith('#', start)) {
        const end = text.indexOf(linebreak, start);
        if (end < 0) break;
        start = end + linebreak.length;
      }
      const line = lineAt(starts, start);
      if (problem !== undefined) {
        const at = problem.index !== undefined ? lineAt(starts, problem.index) : line;
        error = `line ${at}: ${QUOTE_WORDS[problem.code] ?? problem.message}`;
        return;
      }
      const first = r.data[0]?.trim() ?? '';
      if (comments && first.startsWith('#')) return;
      if (comments ? r.data.every((c) => c.trim() === '') : r.data.length === 1 && r.data[0] === '') return;
      records.push({ line, cells: r.data });
    },
  });
  if (error !== null) return { ok: false, error };
  return { ok: true, records };
}
