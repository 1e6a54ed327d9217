/**
 * Darwin Core (TDWG, Darwin Core Maintenance Group, "Darwin Core List of Terms") sampling-event and
 * occurrence tables for count studies, the layout of a Darwin Core Archive with an Event core and an
 * Occurrence extension (GBIF, "Darwin Core Archives – How-to Guide"; GBIF "Best practices in
 * publishing sampling-event data").
 *
 * event.csv — one parent event for the study (eventID = study id; eventDate = the ISO 8601 interval
 * first/last entry) and one child event per counted plot visit (eventID = entry id, parentEventID =
 * study id) with eventDate, fieldNumber (the plot label), samplingProtocol, sampleSizeValue and
 * sampleSizeUnit (the plot area), decimalLatitude / decimalLongitude / geodeticDatum (WGS84) /
 * coordinateUncertaintyInMeters (the device accuracy; left empty when 0, which the term does not allow),
 * eventRemarks (stratum, cluster, note).
 * occurrence.csv — one row per counted plot for the study's taxon: occurrenceID, eventID,
 * basisOfRecord HumanObservation, recordedBy (the device/collector), scientificName,
 * occurrenceStatus (`present`, or `absent` for a zero count — absences are kept), individualCount,
 * organismQuantity with organismQuantityType `individuals`.
 * Voided entries are left out (the tables publish the current record; the bundle keeps the log).
 */
import type { Bundle } from '../bundle/bundle.ts';
import { countedEntries } from '../bundle/events.ts';
import { csvText } from './rfc4180.ts';
import { areaUnitWords } from './units.ts';

export const DWC_EVENT_TERMS = [
  'eventID',
  'parentEventID',
  'datasetName',
  'eventDate',
  'fieldNumber',
  'samplingProtocol',
  'sampleSizeValue',
  'sampleSizeUnit',
  'decimalLatitude',
  'decimalLongitude',
  'geodeticDatum',
  'coordinateUncertaintyInMeters',
  'eventRemarks',
] as const;

export const DWC_OCCURRENCE_TERMS = [
  'occurrenceID',
  'eventID',
  'basisOfRecord',
  'recordedBy',
  'scientificName',
  'occurrenceStatus',
  'individualCount',
  'organismQuantity',
  'organismQuantityType',
] as const;

export type DwcResult = { ok: true; event: string; occurrence: string } | { ok: false; message: string };

type Row = Record<string, string | number | undefined>;

function remarks(parts: [string, string | undefined][]): string | undefined {
  const out = parts.filter(([, v]) => v !== undefined && v !== '').map(([k, v]) => (k ? `${k}: ${v}` : v));
  return out.length ? out.join('; ') : undefined;
}

export function dwcTables(bundle: Bundle): DwcResult {
  const { study } = bundle;
  const s = study.setup;
  if (s.kind !== 'count')
    return { ok: false, message: `Darwin Core tables are made for count studies; this study is ${s.kind}` };
  const name = s.taxon?.trim();
  if (!name)
    return {
      ok: false,
      message: 'Darwin Core needs the counted taxon (study setup "taxon", the scientificName)',
    };
  const entries = countedEntries(bundle.events);
  const times = entries.map((e) => e.at);
  const sorted = [...times].sort((a, b) => Date.parse(a) - Date.parse(b));
  const span =
    sorted.length === 0
      ? undefined
      : sorted.length === 1
        ? sorted[0]
        : `${sorted[0]}/${sorted[sorted.length - 1]}`;
  const protocol = s.samplingProtocol;
  const events: Row[] = [
    {
      eventID: study.id,
      datasetName: study.name,
      eventDate: span,
      samplingProtocol: protocol,
      eventRemarks: study.notes,
    },
  ];
  const occurrences: Row[] = [];
  for (const e of entries) {
    const count = e.value as number;
    events.push({
      eventID: e.id,
      parentEventID: study.id,
      datasetName: study.name,
      eventDate: e.at,
      fieldNumber: e.label,
      samplingProtocol: protocol,
      sampleSizeValue: s.plotArea,
      sampleSizeUnit: s.plotArea !== undefined && s.plotAreaUnit ? areaUnitWords(s.plotAreaUnit) : undefined,
      decimalLatitude: e.position?.lat,
      decimalLongitude: e.position?.lon,
      geodeticDatum: e.position ? 'WGS84' : undefined,
      coordinateUncertaintyInMeters:
        e.position && e.position.accuracyM > 0 ? e.position.accuracyM : undefined,
      eventRemarks: remarks([
        ['stratum', e.stratum],
        ['cluster', e.cluster],
        ['', e.note],
      ]),
    });
    occurrences.push({
      occurrenceID: `${e.id}-occurrence`,
      eventID: e.id,
      basisOfRecord: 'HumanObservation',
      recordedBy: e.device,
      scientificName: name,
      occurrenceStatus: count > 0 ? 'present' : 'absent',
      individualCount: count,
      organismQuantity: count,
      organismQuantityType: 'individuals',
    });
  }
  const table = (terms: readonly string[], rows: Row[]) =>
    csvText([terms, ...rows.map((r) => terms.map((t) => r[t]))]);
  return {
    ok: true,
    event: table(DWC_EVENT_TERMS, events),
    occurrence: table(DWC_OCCURRENCE_TERMS, occurrences),
  };
}
