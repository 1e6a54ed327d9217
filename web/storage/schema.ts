/**
 * The IndexedDB schema (typed for idb). Each version's shape is frozen in its own page: SCHEMA-v1.md,
 * SCHEMA-v2.md (`byVoids` no longer unique) and SCHEMA-v3.md (the current one: the `snapshots` store). A
 * later version adds an `if (oldVersion < N)` step in db.ts and a page of its own beside these, and keeps
 * fixtures of the older versions for the upgrade tests (e2e/fixtures/schema-v1.json).
 *
 * - `studies`: one record per study setup version. The setup is never edited once an observation exists
 *   (`lockedAt`); a changed setup is a new record whose `supersedes` names the old one. Only the
 *   housekeeping fields `lockedAt` and `archivedAt` are ever set on an existing record.
 * - `observations`: append-only event log (entries and voids); never put over, never deleted.
 * - `exports`: append-only log of hand-overs (what was exported up to which seq), for "not yet exported".
 * - `meta`: small key/value facts about this installation (device id, first run, persistence answer).
 * - `snapshots` (from version 3): one running snapshot per study, a cache the field screen opens from
 *   (snapshots.ts); replaced after saves, never the record of anything.
 */
import type { DBSchema } from 'idb';
import type { ObservationRecord, StudyRecord } from '../core.ts';
import type { StoredSnapshot } from './snapshots.ts';

export const DB_NAME = 'sure-enough';
export const DB_VERSION = 3;

/** A study as stored: the shared StudyRecord plus the app's housekeeping (all optional, additive). */
export interface StoredStudy extends StudyRecord {
  /** When the first observation was saved; from then on the setup is locked. */
  lockedAt?: string;
  /** Archived studies leave the main list; nothing is deleted. */
  archivedAt?: string;
  /** When the user acknowledged the cautions at setup. */
  cautionsAcceptedAt?: string;
  /** Device that created the study. */
  device?: string;
  /** Invented demonstration data (Open the demo), labelled as such everywhere. */
  demo?: boolean;
}

export interface ExportRecord {
  id: string;
  studyId: string;
  at: string;
  /** Every observation record with seq ≤ uptoSeq was in this export. */
  uptoSeq: number;
  /** e.g. 'csv', 'bundle', 'geojson'. */
  format: string;
}

export type MetaKey = 'device' | 'firstRunAt' | 'persist';
export interface PersistAnswer {
  at: string;
  /** 'granted' | 'refused' | 'unsupported' */
  answer: 'granted' | 'refused' | 'unsupported';
}

export interface SureEnoughDB extends DBSchema {
  studies: { key: string; value: StoredStudy; indexes: { byCreatedAt: string } };
  observations: {
    key: string;
    value: ObservationRecord;
    /** byVoids: not unique from version 2 (two phones may each void one entry). */
    indexes: { byStudySeq: [string, number]; byVoids: string };
  };
  exports: { key: string; value: ExportRecord; indexes: { byStudy: string } };
  meta: { key: MetaKey; value: string | PersistAnswer };
  /** From version 3: keyed by studyId. */
  snapshots: { key: string; value: StoredSnapshot };
}
