/**
 * The event log as a spreadsheet table (RFC 4180, see rfc4180.ts) and its data dictionary
 * (Broman & Woo 2018, "Data organization in spreadsheets", The American Statistician 72(1), §11
 * "Create a data dictionary").
 *
 * One row per event in seq order — entries and voids — with a `status` column: `counted` (an entry that
 * counts), `voided` (an entry withdrawn by a later void) and `void-record` (the void itself, with the
 * withdrawn entry's id in `voids` and the reason). Times are ISO 8601 with UTC offset exactly as
 * recorded. The value column's name carries the unit (`value_mg_per_kg`; counts `count_per_plot`;
 * pass/fail `outcome_1_or_0`). Booleans are `true` / `false`; missing is an empty field.
 *
 * The dictionary has one row per column of the table, in order, then rows named `study.*` for the
 * study-level design that no column shows (the same five fields, so the file stays one RFC 4180 table):
 * `study.design` (simple random sample, stratified, primary units, stratified with primary units,
 * composite), `study.stratum.NAME.weight` / `.cost` / `.population` for each declared stratum, and for
 * measurements `study.non_detects` (kaplan-meier or half-limit) and `study.reporting_limit`. On these rows
 * `allowed_values` holds this study's setting.
 */
import type { Bundle } from '../bundle/bundle.ts';
import { countedEntries, statusOf } from '../bundle/events.ts';
import type { ObservationRecord, StudySetup } from '../model/records.ts';
import { csvText } from './rfc4180.ts';
import { unitSlug } from './units.ts';

interface Column {
  name: string;
  type: 'uuid' | 'integer' | 'number' | 'text' | 'boolean' | 'datetime';
  unit: string;
  description: string;
  allowed: string;
  get(e: ObservationRecord, status: string): string | number | boolean | undefined;
}

/** Name of the value column for this setup. */
export function valueColumnName(setup: StudySetup): string {
  if (setup.kind === 'count') return 'count_per_plot';
  if (setup.kind === 'pass-fail') return 'outcome_1_or_0';
  const slug = setup.unit ? unitSlug(setup.unit) : '';
  return slug ? `value_${slug}` : 'value';
}

function columns(bundle: Bundle): Column[] {
  const s = bundle.study.setup;
  const valueCol: Column = {
    name: valueColumnName(s),
    type: s.kind === 'measurement' ? 'number' : 'integer',
    unit:
      s.kind === 'count'
        ? `individuals per plot${s.plotArea !== undefined ? ` of ${s.plotArea}${s.plotAreaUnit ? ` ${s.plotAreaUnit}` : ''}` : ''}`
        : s.kind === 'pass-fail'
          ? '1'
          : (s.unit ?? ''),
    description:
      s.kind === 'count'
        ? `Number counted in the plot${s.outcomeName ? ` (${s.outcomeName})` : ''}${s.taxon ? `, ${s.taxon}` : ''}; empty on void records`
        : s.kind === 'pass-fail'
          ? `1 = ${s.outcomeName ?? 'the counted outcome (defect, present, fail)'}, 0 = not; empty on void records`
          : `Measured value${s.outcomeName ? ` (${s.outcomeName})` : ''}; when censored is true it is the reporting limit and the result was below it; empty on void records`,
    allowed: s.kind === 'count' ? 'whole numbers ≥ 0' : s.kind === 'pass-fail' ? '0, 1' : 'decimal numbers',
    get: (e) => e.value,
  };
  const cols: Column[] = [
    {
      name: 'study_id',
      type: 'uuid',
      unit: '',
      description: `Study identifier (${bundle.study.name})`,
      allowed: 'UUID',
      get: (e) => e.studyId,
    },
    {
      name: 'seq',
      type: 'integer',
      unit: '',
      description: 'Position of the event in the study log (1, 2, 3…)',
      allowed: 'whole numbers ≥ 1',
      get: (e) => e.seq,
    },
    {
      name: 'id',
      type: 'uuid',
      unit: '',
      description: 'Event identifier, unique across devices',
      allowed: 'UUID',
      get: (e) => e.id,
    },
    {
      name: 'status',
      type: 'text',
      unit: '',
      description:
        'counted = entry in the estimate; voided = entry withdrawn by a later void record; void-record = the correction itself',
      allowed: 'counted, voided, void-record',
      get: (_e, st) => st,
    },
    {
      name: 'at',
      type: 'datetime',
      unit: '',
      description: 'Time recorded on the device, ISO 8601 with UTC offset',
      allowed: 'YYYY-MM-DDThh:mm:ss[.fff]±hh:mm or Z',
      get: (e) => e.at,
    },
    valueCol,
  ];
  if (s.kind === 'measurement')
    cols.push({
      name: 'censored',
      type: 'boolean',
      unit: '',
      description: `true = below the reporting limit given in the value column (non-detect); non-detects are ${s.nonDetects === 'half-limit' ? 'replaced by half the reporting limit (substitution, as chosen for this study)' : 'handled by the Kaplan–Meier mean (Helsel 2012)'}; see study.non_detects`,
      allowed: 'true, false; empty on void records',
      get: (e) => (e.voids !== undefined ? undefined : e.censored === true),
    });
  cols.push(
    {
      name: 'label',
      type: 'text',
      unit: '',
      description: 'Plot, quadrat, station or item label written in the field',
      allowed: 'any text',
      get: (e) => e.label,
    },
    {
      name: 'stratum',
      type: 'text',
      unit: '',
      description:
        s.strata !== undefined && s.strata.length > 0
          ? 'Stratum the entry belongs to; the estimate is the stratified mean over the declared strata (weights and efforts in the study.stratum.* rows)'
          : 'Stratum the entry belongs to (the study declares no strata: not used by the estimate)',
      allowed:
        s.strata !== undefined && s.strata.length > 0 ? s.strata.map((x) => x.name).join(', ') : 'any text',
      get: (e) => e.stratum,
    },
    {
      name: 'cluster',
      type: 'text',
      unit: '',
      description:
        'Primary unit (transect, room) the entry belongs to; when entries carry one, the primary units are the replicates of the estimate (ratio mean, Cochran 1977 ch. 9)',
      allowed: 'any text',
      get: (e) => e.cluster,
    },
    {
      name: 'latitude',
      type: 'number',
      unit: 'degree (WGS 84)',
      description: 'Latitude of the entry, north positive',
      allowed: '-90 to 90',
      get: (e) => e.position?.lat,
    },
    {
      name: 'longitude',
      type: 'number',
      unit: 'degree (WGS 84)',
      description: 'Longitude of the entry, east positive',
      allowed: '-180 to 180',
      get: (e) => e.position?.lon,
    },
    {
      name: 'position_accuracy_m',
      type: 'number',
      unit: 'm',
      description: 'Accuracy radius reported by the device (W3C Geolocation, 95 % confidence)',
      allowed: 'numbers ≥ 0',
      get: (e) => e.position?.accuracyM,
    },
    {
      name: 'device',
      type: 'text',
      unit: '',
      description: 'Collector: device id or collector name on that device',
      allowed: 'any text',
      get: (e) => e.device,
    },
    {
      name: 'note',
      type: 'text',
      unit: '',
      description: 'Field note typed with the entry',
      allowed: 'any text',
      get: (e) => e.note,
    },
    {
      name: 'voids',
      type: 'uuid',
      unit: '',
      description: 'On void records: id of the entry withdrawn',
      allowed: 'UUID',
      get: (e) => e.voids,
    },
    {
      name: 'void_reason',
      type: 'text',
      unit: '',
      description: 'On void records: why the entry was withdrawn',
      allowed: 'any text',
      get: (e) => e.reason,
    },
    {
      name: 'corrects',
      type: 'uuid',
      unit: '',
      description: 'On corrected entries: id of the entry this one corrects (that entry is voided)',
      allowed: 'UUID',
      get: (e) => e.corrects,
    },
  );
  return cols;
}

/** The event log as CSV (RFC 4180, UTF-8, CRLF), one row per event in seq order. */
export function eventsCsv(bundle: Bundle): string {
  const cols = columns(bundle);
  const status = statusOf(bundle.events);
  const rows = bundle.events.map((e) => cols.map((c) => c.get(e, status.get(e.id) ?? '')));
  return csvText([cols.map((c) => c.name), ...rows]);
}

/** The sampling design as one word group (the `study.design` row). */
export function designName(bundle: Bundle): string {
  const s = bundle.study.setup;
  if (s.design === 'composite') return 'composite';
  const clustered = countedEntries(bundle.events).some((e) => e.cluster !== undefined);
  const stratified = s.strata !== undefined && s.strata.length > 0;
  if (stratified) return clustered ? 'stratified with primary units' : 'stratified';
  return clustered ? 'primary units' : 'simple random sample';
}

const DESIGN_WORDS: Record<string, string> = {
  composite:
    'each entry is one replicate composite (incremental sample); the bound comes from the replicates (Student t, or Chebyshev when chosen)',
  stratified:
    'stratified random sample: the estimate is the stratified mean (Cochran 1977, ch. 5) with a Student t interval on Satterthwaite’s effective degrees of freedom',
  'stratified with primary units':
    'stratified random sample of primary units: the stratified mean (Cochran 1977, ch. 5), each stratum’s primary units (column cluster) as its replicates',
  'primary units':
    'entries grouped in primary units (column cluster): the ratio mean with the primary units as the replicates (Cochran 1977, ch. 9)',
  'simple random sample': 'entries treated as a simple random sample of independent values',
};

/** The `study.*` rows of the dictionary (see the file comment): column, type, unit, description, value. */
function studyRows(bundle: Bundle): string[][] {
  const s = bundle.study.setup;
  const design = designName(bundle);
  const rows: string[][] = [
    ['study.design', 'text', '', `Study setting: sampling design — ${DESIGN_WORDS[design]}`, design],
  ];
  const strata = s.strata ?? [];
  const total = strata.reduce((t, x) => t + x.weight, 0);
  for (const x of strata) {
    rows.push([
      `study.stratum.${x.name}.weight`,
      'number',
      'relative weight',
      `Study setting: weight of stratum ${x.name} (area share, area or number of units, as entered; rescaled to sum to 1, here ${Number(((100 * x.weight) / total).toPrecision(4))} %)`,
      String(x.weight),
    ]);
    if (x.cost !== undefined)
      rows.push([
        `study.stratum.${x.name}.cost`,
        'number',
        'effort per entry',
        `Study setting: effort of one entry in stratum ${x.name} (minutes, money; strata without one count 1), used to suggest where the next entry narrows the interval most`,
        String(x.cost),
      ]);
    if (x.population !== undefined)
      rows.push([
        `study.stratum.${x.name}.population`,
        'integer',
        'units',
        `Study setting: number of units in stratum ${x.name} (finite population correction)`,
        String(x.population),
      ]);
  }
  if (s.kind === 'measurement') {
    rows.push([
      'study.non_detects',
      'text',
      '',
      s.nonDetects === 'half-limit'
        ? 'Study setting: how results below a reporting limit (censored = true) are used — replaced by half the reporting limit (substitution, as chosen for this study)'
        : 'Study setting: how results below a reporting limit (censored = true) are used — Kaplan–Meier mean and standard deviation (Helsel 2012); no mean above 50 % non-detects',
      s.nonDetects ?? 'kaplan-meier',
    ]);
    if (s.reportingLimit !== undefined)
      rows.push([
        'study.reporting_limit',
        'number',
        s.unit ?? '',
        'Study setting: the laboratory’s reporting limit',
        String(s.reportingLimit),
      ]);
  }
  return rows;
}

/**
 * The data dictionary of eventsCsv: one row per column (column, type, unit, description, allowed_values),
 * then the `study.*` rows of the study-level design.
 */
export function dataDictionaryCsv(bundle: Bundle): string {
  const cols = columns(bundle);
  return csvText([
    ['column', 'type', 'unit', 'description', 'allowed_values'],
    ...cols.map((c) => [c.name, c.type, c.unit, c.description, c.allowed]),
    ...studyRows(bundle),
  ]);
}
