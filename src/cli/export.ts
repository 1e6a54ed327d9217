/**
 * `sure-enough export --format csv|geojson|dwc|report|values BUNDLE`: a study bundle in an open format on stdout.
 * Also home of `readBundle`, shared with `merge`.
 */
import type { Bundle } from '../bundle/bundle.ts';
import { parseBundle } from '../bundle/validate.ts';
import { coverageStatement } from '../export/coverage.ts';
import { dataDictionaryCsv, eventsCsv } from '../export/csv.ts';
import { dwcTables } from '../export/dwc.ts';
import { geoJsonText } from '../export/geojson.ts';
import { assessInputCsv } from '../export/recipe.ts';
import { reportHtml } from '../export/report.ts';
import { type FlagSpec, type ParsedArgs, readInput, UsageError } from './io.ts';

export const summary =
  'a study bundle as CSV, GeoJSON, Darwin Core tables, a printable HTML report or values for assess';

export const help = `usage: sure-enough export --format csv|geojson|dwc|report|values [--dictionary] [--table event|occurrence] BUNDLE

Reads a study bundle (FILE, or - for standard input), checks it (format, version, every field, checksum)
and prints the export on stdout:
  csv       RFC 4180 (UTF-8, CRLF), one row per event in seq order, entries and voids, with a status
            column (counted | voided | void-record), ISO 8601 times with offset, the unit in the value
            column's name (e.g. value_mg_per_kg; counts: count_per_plot; pass/fail: outcome_1_or_0).
            --dictionary prints the data dictionary instead: one row per column (column, type, unit,
            description, allowed_values), then rows "study.*" describing the study-level design (sampling
            design, each stratum's weight and effort, non-detect method, reporting limit); on those
            rows allowed_values holds this study's setting.
  geojson   RFC 7946 FeatureCollection of the entries with a position: Point [longitude, latitude]
            (WGS 84), the accuracy radius as property accuracy_m, the event UUID as the feature id.
  dwc       count studies with a taxon only: Darwin Core sampling-event table (event.csv) and occurrence
            table (occurrence.csv); zero counts are kept as absences. --table event|occurrence prints
            one table; without it both are printed, each after a line "# event.csv" / "# occurrence.csv"
            and separated by an empty line (use --table for files a program reads).
  report    a self-contained printable HTML page (print it to PDF from a browser): setup, verdict and
            interval, method statement, running-interval chart, entries and voids, collectors' shares,
            cautions, the SHA-256 of the event log, and the commands that reproduce its figures.
  values    the counted entries in log order as input for \`sure-enough assess\` (the report's recipe): a
            CSV with a value column (<RL for a non-detect) and stratum / cluster columns when entries
            carry them. With the report's assess flags it gives the report's figures exactly.
A bundle that fails any check is refused: the problems are listed on stderr (exit code 2, nothing on stdout).
`;

/** Reads and validates a bundle; every problem becomes a UsageError naming the file. */
export async function readBundle(file: string | undefined): Promise<Bundle> {
  const name = file === undefined || file === '-' ? 'standard input' : file;
  const result = await parseBundle(readInput(file));
  if (!result.ok)
    throw new UsageError(`${name}: not a valid study bundle:\n  ${result.problems.join('\n  ')}`);
  return result.bundle;
}

export const flags: FlagSpec = { format: 'string', dictionary: 'boolean', table: 'string' };

export async function run(args: ParsedArgs): Promise<string> {
  const format = args.flags.get('format');
  if (format === undefined) throw new UsageError('flag --format is required: csv, geojson, dwc or report');
  if (!['csv', 'geojson', 'dwc', 'report', 'values'].includes(format))
    throw new UsageError(`flag --format: "${format}" is not one of csv, geojson, dwc, report, values`);
  const dictionary = args.flags.get('dictionary');
  if (dictionary !== undefined && format !== 'csv')
    throw new UsageError('flag --dictionary goes with --format csv');
  if (dictionary !== undefined && dictionary !== 'true')
    throw new UsageError('flag --dictionary takes no value');
  const table = args.flags.get('table');
  if (table !== undefined && format !== 'dwc') throw new UsageError('flag --table goes with --format dwc');
  if (table !== undefined && table !== 'event' && table !== 'occurrence')
    throw new UsageError(`flag --table: "${table}" is not one of event, occurrence`);
  if (args.positional.length !== 1)
    throw new UsageError(`export takes one BUNDLE (FILE or -), got ${args.positional.length}`);
  const bundle = await readBundle(args.positional[0]);
  switch (format) {
    case 'csv':
      return dictionary ? dataDictionaryCsv(bundle) : eventsCsv(bundle);
    case 'geojson':
      return geoJsonText(bundle);
    case 'values':
      return assessInputCsv(bundle);
    case 'dwc': {
      const r = dwcTables(bundle);
      if (!r.ok) throw new UsageError(r.message);
      if (table === 'event') return r.event;
      if (table === 'occurrence') return r.occurrence;
      return `# event.csv\n${r.event}\n# occurrence.csv\n${r.occurrence}`;
    }
    default:
      return await reportHtml(bundle, { coverage: coverageStatement(bundle.study.setup) });
  }
}
