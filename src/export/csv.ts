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
 */
import type { Bundle } from '../bundle/bundle.ts';
import { statusOf } from '../bundle/events.ts';
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
      description: 'true = below the reporting limit given in the value column (non-detect)',
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
      description: 'Stratum the entry belongs to',
      allowed: 'any text',
      get: (e) => e.stratum,
    },
    {
      name: 'cluster',
      type: 'text',
      unit: '',
      description: 'Primary unit (transect, room, composite) the entry belongs to',
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

/** The data dictionary of eventsCsv: one row per column (column, type, unit, description, allowed_values). */
export function dataDictionaryCsv(bundle: Bundle): string {
  const cols = columns(bundle);
  return csvText([
    ['column', 'type', 'unit', 'description', 'allowed_values'],
    ...cols.map((c) => [c.name, c.type, c.unit, c.description, c.allowed]),
  ]);
}
