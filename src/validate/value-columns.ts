/**
 * How a values text is laid out: plain value lines, a CSV with a value column, or the project's own CSV
 * export (src/export/csv.ts). The export names its value column after the data — `value_<unit>` for
 * measurements (`value_mg_per_kg`), `count_per_plot` for counts, `outcome_1_or_0` for pass/fail — and
 * adds `study_id`, `seq` and `status` columns (entries, withdrawn entries and the void records). The
 * names are matched here so that what the writer produces, this reads back; test/cli/round-trip.test.ts
 * checks it for every data kind.
 */
import type { DataKind } from '../model/types.ts';
import { type CsvRecord, type CsvSeparator, readCsv } from './csv-read.ts';

/** A header cell that names a value column, and the data kind it implies (none for plain `value…`). */
export function valueColumnKind(name: string): { kind?: DataKind } | null {
  const n = name.trim().toLowerCase();
  if (n === 'count_per_plot') return { kind: 'count' };
  if (n === 'outcome_1_or_0') return { kind: 'pass-fail' };
  if (n === 'value') return {};
  // value_<unit slug>: the export's measurement column (a slug is letters, digits and _; src/export/units.ts)
  if (/^value_[a-z0-9_]+$/.test(n)) return { kind: 'measurement' };
  return null;
}

export interface ValueTable {
  /** `lines`: one value per line; `csv`: a header with a value column; `export`: the project's CSV export. */
  format: 'lines' | 'csv' | 'export';
  separator: CsvSeparator;
  /** The header as written (empty for lines). */
  header: string[];
  valueColumn: number;
  /** The value column's name as written (`value` for lines). */
  valueName: string;
  /** The data kind the value column's name implies, when it implies one. */
  kind?: DataKind;
  stratum?: number;
  cluster?: number;
  /** The export's `status` column (only `counted` rows are values) and `censored` column. */
  status?: number;
  censored?: number;
}

export type FoundTable = { ok: true; table: ValueTable; records: CsvRecord[] } | { ok: false; error: string };

/** The value column of a header: an exact `value` first, else the first name valueColumnKind accepts. */
function valueColumnOf(header: readonly string[]): number {
  const names = header.map((c) => c.trim().toLowerCase());
  const exact = names.indexOf('value');
  return exact >= 0 ? exact : names.findIndex((n) => valueColumnKind(n) !== null);
}

/**
 * Reads the text with the one CSV reader and decides its layout from the first record: a header holding
 * a value column (tried with `,`, then `;`, then tab; a one-column header only with `,`), else value lines.
 */
export function findTable(text: string): FoundTable {
  const comma = readCsv(text, ',');
  if (!comma.ok) return comma;
  for (const separator of [',', ';', '\t'] as const) {
    const read = separator === ',' ? comma : readCsv(text, separator);
    if (!read.ok || read.records.length === 0) continue;
    const header = read.records[0]!.cells;
    const valueColumn = valueColumnOf(header);
    if (valueColumn < 0 || (header.length === 1 && separator !== ',')) continue;
    const names = header.map((c) => c.trim().toLowerCase());
    const col = (name: string) => (names.includes(name) ? names.indexOf(name) : undefined);
    const isExport = ['study_id', 'seq', 'status'].every((n) => names.includes(n));
    const table: ValueTable = {
      format: isExport ? 'export' : 'csv',
      separator,
      header,
      valueColumn,
      valueName: header[valueColumn]!.trim(),
    };
    // a plain CSV's `value_…` column implies nothing; the export's does (its name is the writer's choice)
    const kind = valueColumnKind(names[valueColumn]!)?.kind;
    if (kind !== undefined && (isExport || kind !== 'measurement')) table.kind = kind;
    const stratum = col('stratum');
    if (stratum !== undefined) table.stratum = stratum;
    const cluster = col('cluster');
    if (cluster !== undefined) table.cluster = cluster;
    if (isExport) {
      table.status = col('status')!;
      const censored = col('censored');
      if (censored !== undefined) table.censored = censored;
    }
    return { ok: true, table, records: read.records };
  }
  return {
    ok: true,
    table: { format: 'lines', separator: ',', header: [], valueColumn: 0, valueName: 'value' },
    records: comma.records,
  };
}
