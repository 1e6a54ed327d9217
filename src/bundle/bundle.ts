/**
 * The study bundle: a study's setup and its complete event log in one JSON file, with a format
 * version and a SHA-256 checksum over a canonical serialisation (schema: src/bundle/SCHEMA.md).
 */
import type { ObservationRecord, Position, StudyRecord } from '../model/records.ts';
// the setup's members are the one validator's list (src/model/setup.ts)
import { SETUP_KEYS } from '../model/setup.ts';
import { canonicalJson } from './canonical.ts';
import { sha256Hex } from './digest.ts';

export const BUNDLE_FORMAT = 'sure-enough-bundle';
export const BUNDLE_VERSION = 1;

export interface Bundle {
  format: typeof BUNDLE_FORMAT;
  version: typeof BUNDLE_VERSION;
  study: StudyRecord;
  /** Entries and voids in seq order (seq = 1, 2, 3…). */
  events: ObservationRecord[];
  checksum: { algorithm: 'SHA-256'; value: string };
}

/**
 * SHA-256 (hex) of the canonical JSON (RFC 8785) of `{"events": [...], "study": {...}}`. Asynchronous (the
 * platform's digest): compute it before opening an IndexedDB transaction, never inside one.
 */
export function bundleChecksum(study: StudyRecord, events: readonly ObservationRecord[]): Promise<string> {
  return sha256Hex(canonicalJson({ study, events }));
}

/** SHA-256 (hex) of the canonical JSON of the event log alone (shown on the report). */
export function eventLogHash(events: readonly ObservationRecord[]): Promise<string> {
  return sha256Hex(canonicalJson(events));
}

/**
 * Every member of each record type, checked by the compiler: adding a field to StudyRecord or
 * ObservationRecord without listing it here is a type error (so the bundle never drops it silently); the
 * setup's members come from the setup validator's own checked list.
 */
const STUDY_MEMBERS: Record<keyof StudyRecord, true> = {
  id: true,
  name: true,
  createdAt: true,
  setup: true,
  notes: true,
  version: true,
  supersedes: true,
};
const EVENT_MEMBERS: Record<keyof ObservationRecord, true> = {
  id: true,
  studyId: true,
  seq: true,
  at: true,
  value: true,
  censored: true,
  stratum: true,
  cluster: true,
  position: true,
  note: true,
  device: true,
  voids: true,
  reason: true,
  label: true,
  corrects: true,
};
const STUDY_KEYS = Object.keys(STUDY_MEMBERS) as (keyof StudyRecord)[];
const EVENT_KEYS = Object.keys(EVENT_MEMBERS) as (keyof ObservationRecord)[];

/** The bundle's known field names (validation refuses any other). */
export const KNOWN_KEYS = {
  setup: SETUP_KEYS as readonly string[],
  study: STUDY_KEYS as readonly string[],
  event: EVENT_KEYS as readonly string[],
  position: ['lat', 'lon', 'accuracyM'] as readonly string[],
};

function pick<T extends object>(source: T, keys: readonly (keyof T)[]): T {
  const out: Partial<T> = {};
  for (const k of keys) if (source[k] !== undefined) out[k] = source[k];
  return out as T;
}

function copyJson<T>(value: T): T {
  return value === undefined ? value : (JSON.parse(JSON.stringify(value)) as T);
}

/** An event with only the bundle's members (storage-only members left out), as a fresh copy. */
export function cleanEvent(e: ObservationRecord): ObservationRecord {
  const c = copyJson(pick(e, EVENT_KEYS));
  if (e.position) c.position = pick(e.position, ['lat', 'lon', 'accuracyM'] as (keyof Position)[]);
  return c;
}

/** A study record with only the bundle's members (storage-only members left out), as a fresh copy. */
export function cleanStudy(study: StudyRecord): StudyRecord {
  return { ...copyJson(pick(study, STUDY_KEYS)), setup: copyJson(pick(study.setup, SETUP_KEYS)) };
}

/**
 * Builds a bundle from stored records: keeps only the schema's fields (storage-only fields are left
 * out), orders events by seq, and computes the checksum. The records are copied, not shared.
 */
export async function makeBundle(study: StudyRecord, events: readonly ObservationRecord[]): Promise<Bundle> {
  const s = cleanStudy(study);
  const cleanEvents = [...events].sort((a, b) => a.seq - b.seq).map(cleanEvent);
  return {
    format: BUNDLE_FORMAT,
    version: BUNDLE_VERSION,
    study: s,
    events: cleanEvents,
    checksum: { algorithm: 'SHA-256', value: await bundleChecksum(s, cleanEvents) },
  };
}

/** The bundle as a file: pretty-printed JSON (two-space indent) ending with a newline. */
export function serializeBundle(bundle: Bundle): string {
  return `${JSON.stringify(bundle, null, 2)}\n`;
}
