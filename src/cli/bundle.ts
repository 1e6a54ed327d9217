/**
 * `sure-enough bundle [FILE|-]`: values (as for `assess`, including `<RL` non-detects for measurements,
 * `value,stratum[,cluster]` lines and `stratum` / `cluster` CSV columns) plus the study flags → a study
 * bundle (src/bundle/SCHEMA.md) the app can import and `merge` can pool.
 * A CSV may also carry `label`, `at`, `lat`, `lon`, `accuracy_m`, `note` and `device` columns; each is
 * checked, and a problem is named by its line.
 * Own flags (all optional): --name, --unit, --device, --at, --id, --outcome, --taxon, --protocol,
 * --plot-area-unit, --reporting-limit, --notes (documented in `sure-enough help bundle`).
 */
import { randomUUID } from 'node:crypto';
import { makeBundle, serializeBundle } from '../bundle/bundle.ts';
import { derivedUuid, formatIso, shiftIso } from '../bundle/ids.ts';
import { isIsoTimeWithOffset, isUuid, parseBundle } from '../bundle/validate.ts';
import type { ObservationRecord, Position, StudyRecord, StudySetup } from '../model/records.ts';
import { parseValues, type ValueTable } from '../validate/parse-values.ts';
import { type FlagSpec, type ParsedArgs, readInput, UsageError } from './io.ts';
import { parseStudyFlags, STUDY_FLAGS } from './study-flags.ts';

export const summary = 'build a study bundle (JSON) the app can import from a list of values';

const OWN_FLAGS = [
  'name',
  'unit',
  'device',
  'at',
  'id',
  'outcome',
  'taxon',
  'protocol',
  'plot-area-unit',
  'reporting-limit',
  'notes',
];
export const flags: FlagSpec = { ...STUDY_FLAGS, ...Object.fromEntries(OWN_FLAGS.map((f) => [f, 'string'])) };

export const help = `usage: sure-enough bundle [FILE|-] --kind KIND [study flags] [bundle flags]

Reads values as assess does (one per line, or a CSV with a "value" column; <RL marks a measurement below a
reporting limit; value,stratum or value,stratum,cluster lines; "stratum" and "cluster" CSV columns) and
prints a study bundle (format "sure-enough-bundle", version 1) on stdout: the study's setup and one entry
per value, with a SHA-256 checksum. The app imports it; \`merge\` pools it with bundles from phones of the
same study (same --id and identical setup). With --strata, every entry needs a stratum that --strata
declares.

Optional CSV columns (header names as written here, any order, any letter case; an empty cell = not given):
  label        plot, quadrat, station or item label
  at           time of the entry, RFC 3339 / ISO 8601 with seconds and UTC offset
               (2026-05-04T09:15:00+02:00 or …Z); an empty cell gets the default time (see --at)
  lat, lon     position in WGS 84 decimal degrees (lat −90…90, lon −180…180); both or neither,
               and with accuracy_m
  accuracy_m   accuracy radius of the position in metres (≥ 0; the 95 % radius where known)
  note         field note
  device       collector or device of the entry (default: --device)
A decimal comma is accepted in lat, lon and accuracy_m when the CSV uses ; or tab between cells. Other
columns are ignored. A bad cell stops the command with a message naming its line (exit code 2).

Bundle flags:
  --name TEXT           study name (default "Imported values")
  --unit UCUM           unit of the values, a UCUM code where there is one (mg/kg, ug/L); measurements
  --device TEXT         collector / source recorded on entries without a device cell (default "import")
  --at TIME             RFC 3339 time with UTC offset: the study's createdAt and the time of the first
                        entry without an "at" cell; entry i without one is timed --at + (i − 1) seconds so
                        the order survives a merge. Default: the earliest "at" cell, else now (local offset)
  --id UUID             study id (lower-case UUID). Give the id of an existing study to pool with it.
                        Default: a new random id. Event ids are derived from the study id, the entry's
                        device, the study's createdAt and the entry number (UUID version 8 from SHA-256):
                        the same input and flags give the same ids (pooling it twice changes nothing);
                        another device or start time gives other ids.
  --outcome TEXT        what is measured or counted, in words
  --taxon NAME          scientific name of the counted taxon (counts; needed by export --format dwc)
  --protocol TEXT       sampling protocol in words (Darwin Core samplingProtocol)
  --plot-area-unit UCUM unit of --plot-area (e.g. m2)
  --reporting-limit RL  laboratory reporting limit, in --unit (measurements)
  --notes TEXT          study notes
`;

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const COMMA_DECIMAL = /^[+-]?\d*,\d+([eE][+-]?\d+)?$/;
/** The optional per-entry CSV columns this command reads (besides value, stratum and cluster). */
export const ENTRY_COLUMNS = ['label', 'at', 'lat', 'lon', 'accuracy_m', 'note', 'device'] as const;
type EntryColumn = (typeof ENTRY_COLUMNS)[number];
const MAX_ERRORS = 20;

function optionalText(flags: Map<string, string>, name: string): string | undefined {
  const v = flags.get(name);
  if (v === undefined) return undefined;
  if (v.trim() === '') throw new UsageError(`flag --${name}: must not be empty`);
  return v;
}

interface CsvLayout {
  sep: string;
  columns: Partial<Record<EntryColumn, number>>;
}

/** The positions of the optional entry columns in the header parseValues found (null for value lines). */
function csvLayout(table: ValueTable): CsvLayout | null {
  if (table.format === 'lines') return null;
  const cells = table.header.map((c) => c.trim().toLowerCase());
  const columns: CsvLayout['columns'] = {};
  for (const name of ENTRY_COLUMNS) if (cells.includes(name)) columns[name] = cells.indexOf(name);
  return { sep: table.separator, columns };
}

function cellNumber(raw: string, sep: string): number | null {
  if (NUMBER.test(raw)) return Number(raw);
  if (sep !== ',' && COMMA_DECIMAL.test(raw)) return Number(raw.replace(',', '.'));
  return null;
}

/** What the optional columns say about one entry, or the problems found (without the line prefix). */
interface EntryCells {
  label?: string;
  at?: string;
  position?: Position;
  note?: string;
  device?: string;
}

function readEntryCells(cells: readonly string[], layout: CsvLayout, problems: string[]): EntryCells {
  const cell = (name: EntryColumn): string => {
    const i = layout.columns[name];
    return i === undefined ? '' : (cells[i] ?? '').trim();
  };
  const out: EntryCells = {};
  for (const name of ['label', 'note', 'device'] as const) {
    const v = cell(name);
    if (v !== '') out[name] = v;
  }
  const at = cell('at');
  if (at !== '') {
    if (isIsoTimeWithOffset(at)) out.at = at;
    else
      problems.push(
        `"at" ${JSON.stringify(at)} is not an ISO 8601 time with seconds and UTC offset (e.g. 2026-05-04T09:15:00+02:00)`,
      );
  }
  const coords: Partial<Record<'lat' | 'lon' | 'accuracy_m', number>> = {};
  const limits = { lat: [-90, 90], lon: [-180, 180], accuracy_m: [0, Number.POSITIVE_INFINITY] } as const;
  for (const name of ['lat', 'lon', 'accuracy_m'] as const) {
    const raw = cell(name);
    if (raw === '') continue;
    const v = cellNumber(raw, layout.sep);
    const [lo, hi] = limits[name];
    if (v === null) problems.push(`"${name}" ${JSON.stringify(raw)} is not a number`);
    else if (!(v >= lo && v <= hi))
      problems.push(
        name === 'accuracy_m'
          ? `"accuracy_m" ${raw} must be ≥ 0 (metres)`
          : `"${name}" ${raw} is outside ${lo}…${hi} degrees`,
      );
    else coords[name] = v;
  }
  const given = (['lat', 'lon', 'accuracy_m'] as const).filter((k) => cell(k) !== '');
  if (given.length > 0 && given.length < 3) {
    const missing = (['lat', 'lon', 'accuracy_m'] as const).filter((k) => cell(k) === '');
    problems.push(
      `a position needs lat, lon and accuracy_m together; ${missing.map((m) => `"${m}"`).join(' and ')} ${missing.length === 1 ? 'is' : 'are'} empty`,
    );
  } else if (coords.lat !== undefined && coords.lon !== undefined && coords.accuracy_m !== undefined)
    out.position = { lat: coords.lat, lon: coords.lon, accuracyM: coords.accuracy_m };
  return out;
}

function buildSetup(f: Map<string, string>): StudySetup {
  const setup: StudySetup = { ...parseStudyFlags(f) };
  const unit = optionalText(f, 'unit');
  if (unit !== undefined) setup.unit = unit;
  const outcome = optionalText(f, 'outcome');
  if (outcome !== undefined) setup.outcomeName = outcome;
  const taxon = optionalText(f, 'taxon');
  if (taxon !== undefined) {
    if (setup.kind !== 'count') throw new UsageError('flag --taxon applies to counts only (--kind count)');
    setup.taxon = taxon;
  }
  const protocol = optionalText(f, 'protocol');
  if (protocol !== undefined) setup.samplingProtocol = protocol;
  const areaUnit = optionalText(f, 'plot-area-unit');
  if (areaUnit !== undefined) {
    if (setup.plotArea === undefined) throw new UsageError('flag --plot-area-unit needs --plot-area');
    setup.plotAreaUnit = areaUnit;
  }
  const rl = f.get('reporting-limit');
  if (rl !== undefined) {
    if (setup.kind !== 'measurement')
      throw new UsageError('flag --reporting-limit applies to measurements only');
    const v = Number(rl.trim());
    if (!NUMBER.test(rl.trim()) || !(v > 0))
      throw new UsageError(`flag --reporting-limit: "${rl}" is not a number above 0`);
    setup.reportingLimit = v;
  }
  return setup;
}

export async function run(args: ParsedArgs): Promise<string> {
  if (args.positional.length > 1)
    throw new UsageError(
      `bundle takes one input (FILE or -), got ${args.positional.length}: ${args.positional.join(' ')}`,
    );
  const f = args.flags;
  const setup = buildSetup(f);
  const id = f.get('id') ?? randomUUID();
  if (!isUuid(id))
    throw new UsageError(`flag --id: "${id}" is not a lower-case UUID (8-4-4-4-12 hexadecimal digits)`);
  const atFlag = f.get('at');
  if (atFlag !== undefined && !isIsoTimeWithOffset(atFlag))
    throw new UsageError(
      `flag --at: "${atFlag}" is not an RFC 3339 time with UTC offset (e.g. 2026-05-04T09:15:00+02:00)`,
    );
  const deviceFlag = optionalText(f, 'device') ?? 'import';
  const name = optionalText(f, 'name') ?? 'Imported values';

  const text = readInput(args.positional[0]);
  const parsed = parseValues(text, setup.kind);
  if (!parsed.ok) throw new UsageError(parsed.errors.join('\n'));
  if (parsed.points.length === 0)
    throw new UsageError(`${args.positional[0] ?? 'standard input'}: no values found`);

  // Per-entry cells beyond the value: stratum / cluster come from parseValues, the rest from the CSV row.
  const layout = csvLayout(parsed.table);
  const declared = setup.strata?.map((s) => s.name);
  const errors: string[] = [];
  const extras: EntryCells[] = parsed.points.map((p, i) => {
    const lineNo = parsed.lines[i]!;
    const problems: string[] = [];
    const cells = layout === null ? {} : readEntryCells(parsed.cells[i]!, layout, problems);
    if (declared !== undefined) {
      if (p.stratum === undefined)
        problems.push(`no stratum given; --strata declares ${declared.map((d) => `"${d}"`).join(', ')}`);
      else if (!declared.includes(p.stratum))
        problems.push(
          `stratum ${JSON.stringify(p.stratum)} is not one --strata declares (${declared.map((d) => `"${d}"`).join(', ')})`,
        );
    }
    for (const problem of problems) if (errors.length < MAX_ERRORS) errors.push(`line ${lineNo}: ${problem}`);
    return cells;
  });
  if (errors.length > 0) throw new UsageError(errors.join('\n'));

  const rowTimes = extras.map((x) => x.at).filter((t): t is string => t !== undefined);
  const earliest = rowTimes.reduce<string | undefined>(
    (a, t) => (a === undefined || Date.parse(t) < Date.parse(a) ? t : a),
    undefined,
  );
  const at =
    atFlag ?? earliest ?? formatIso(Math.floor(Date.now() / 1000) * 1000, -new Date().getTimezoneOffset());

  const study: StudyRecord = { id, name, createdAt: at, setup, version: 1 };
  const notes = optionalText(f, 'notes');
  if (notes !== undefined) study.notes = notes;
  const ids = await Promise.all(
    parsed.points.map((_, i) => derivedUuid(`${id}/${extras[i]!.device ?? deviceFlag}/${at}/${i + 1}`)),
  );
  const events: ObservationRecord[] = parsed.points.map((p, i) => {
    const x = extras[i]!;
    const device = x.device ?? deviceFlag;
    const e: ObservationRecord = {
      id: ids[i]!,
      studyId: id,
      seq: i + 1,
      at: x.at ?? shiftIso(at, i),
      value: p.value,
      device,
    };
    if (p.censored) e.censored = true;
    if (p.stratum !== undefined) e.stratum = p.stratum;
    if (p.cluster !== undefined) e.cluster = p.cluster;
    if (x.position !== undefined) e.position = x.position;
    if (x.label !== undefined) e.label = x.label;
    if (x.note !== undefined) e.note = x.note;
    return e;
  });
  const out = serializeBundle(await makeBundle(study, events));
  // Safety net: what this command writes must pass the same checks as any imported bundle.
  const check = await parseBundle(out);
  if (!check.ok) throw new UsageError(`the bundle would not be valid:\n  ${check.problems.join('\n  ')}`);
  return out;
}
