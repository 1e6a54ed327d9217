/**
 * Stored records: the study and its append-only event log (entries and voids).
 *
 * These are the shapes the app keeps in IndexedDB, the study bundle carries (src/bundle/SCHEMA.md),
 * and every export reads. The statistics never read them directly: `pointsOf` (src/bundle/events.ts)
 * turns the event log into the core's `Point[]` (entries that are not voided, in seq order).
 *
 * Field names are a contract shared by web/storage, src/bundle and src/export: add optional fields if
 * needed, never rename.
 */
import type { AnalysisSetup } from './types.ts';

/**
 * The stored setup: everything the statistics need (AnalysisSetup) plus what a reader of the data needs.
 * `plotArea` (counts) and the limit's `source` / `date` (target kind `limit`) live in AnalysisSetup.
 */
export interface StudySetup extends AnalysisSetup {
  /** Unit of the values, a UCUM code where there is one (`mg/kg`, `ug/L`, `1` for counts), e.g. "mg/kg". */
  unit?: string;
  /** Unit of the plot area (UCUM, e.g. `m2`); counts only. */
  plotAreaUnit?: string;
  /** What is measured or counted, in the crew's words ("lead in topsoil", "defective weld", "Carex nigra"). */
  outcomeName?: string;
  /** Scientific name of the counted taxon (counts; becomes Darwin Core `scientificName`). */
  taxon?: string;
  /** How a unit was sampled, in words or a protocol reference (Darwin Core `samplingProtocol`). */
  samplingProtocol?: string;
  /** Reporting limit of the laboratory (measurements with non-detects), in `unit`. */
  reportingLimit?: number;
  /** How the study writes numbers: its decimal separator on every screen (absent: the phone's locale). */
  decimalSeparator?: '.' | ',';
  /**
   * Values the crew expects, in `unit` (measurements, counts per plot): a value outside is questioned
   * before it is saved, never refused. Either end may be left open.
   */
  expectedRange?: { low?: number; high?: number };
  /** Position accuracy (metres) above which an entry's position is saved with a warning (default 30). */
  positionWarnM?: number;
  /** Pass/fail: the other result in the crew's words ("latches"); absent: "no " + `outcomeName`. */
  otherOutcomeName?: string;
}

/** One study: created once; a changed setup is a new version that `supersedes` the old record's id. */
export interface StudyRecord {
  /** UUID (RFC 9562 text form, lower case). */
  id: string;
  name: string;
  /** ISO 8601 date-time with UTC offset. */
  createdAt: string;
  setup: StudySetup;
  notes?: string;
  /** Setup version, 1 for the first. */
  version: number;
  /** Id of the study record this version replaces. */
  supersedes?: string;
}

/** Where an entry was taken (W3C Geolocation: WGS 84 degrees; accuracy radius in metres at 95 %). */
export interface Position {
  lat: number;
  lon: number;
  accuracyM: number;
}

/**
 * One event of a study's log. Two sorts share this shape:
 * - an **entry** has `value` (and no `voids`);
 * - a **void** has `voids` (the id of the entry it withdraws) and `reason`, and no `value`.
 * Records are never changed or deleted; a correction is a void plus a new entry.
 */
export interface ObservationRecord {
  /** UUID of this event. */
  id: string;
  studyId: string;
  /** Position in the study's log, 1, 2, 3… (re-assigned on merge; see src/bundle/merge.ts). */
  seq: number;
  /** ISO 8601 date-time with UTC offset, from the device clock. */
  at: string;
  /** The observation (entries only): a measurement in `setup.unit`, a count per plot, or 1/0 for pass/fail. */
  value?: number;
  /** True when `value` is a reporting limit and the result was below it (non-detect). */
  censored?: boolean;
  stratum?: string;
  /** Primary unit (transect, room, composite) the entry belongs to. */
  cluster?: string;
  position?: Position;
  note?: string;
  /** Who recorded it: a device id or a collector's name on that device. */
  device: string;
  /** Void events only: id of the entry this event withdraws. */
  voids?: string;
  /** Void events only: why. */
  reason?: string;
  /** Plot, quadrat, station or item label the crew wrote on the ground. */
  label?: string;
  /**
   * Entries only: the id of the entry this one corrects. A correction is a void of the old entry plus this
   * new entry; the link keeps the correction's origin in the log, the CSV and the bundle.
   */
  corrects?: string;
}
