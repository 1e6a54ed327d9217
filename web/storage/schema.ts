/**
 * The IndexedDB schema (typed for idb). Each version's shape is frozen in its own page: SCHEMA-v1.md,
 * SCHEMA-v2.md (`byVoids` no longer unique), SCHEMA-v3.md (the `snapshots` store) and SCHEMA-v4.md (the
 * current one: `crewLinks` and `crewEvents`, for syncing with a crew server). A
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
 * - `crewLinks` (from version 4): one record per study shared with or joined from a crew server: the
 *   server, this phone's token and id there, the pull cursor, how far this phone's own events were
 *   acknowledged, the last sync and a refusal that stopped syncing (crew.ts).
 * - `crewEvents` (from version 4): events of the other phones of a crew, pulled from the crew server.
 *   Kept apart from `observations`, so this phone's own log, its verdict, exports and bundles stay
 *   exactly this phone's; the crew view pools both (web/sync).
 */
import type { DBSchema } from 'idb';
import type { ObservationRecord, StudyRecord } from '../core.ts';
import type { StoredSnapshot } from './snapshots.ts';

export const DB_NAME = 'sure-enough';
export const DB_VERSION = 4;

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

/** `shareKey:<study id>`: the key a study was shared with the crew server under (meta.ts, shareKeyFor). */
export type MetaKey = 'device' | 'firstRunAt' | 'persist' | `shareKey:${string}`;
export interface PersistAnswer {
  at: string;
  /** 'granted' | 'refused' | 'unsupported' */
  answer: 'granted' | 'refused' | 'unsupported';
}

/** How this phone takes part in a crew's study on a crew server (SCHEMA-v4.md). */
export interface CrewLink {
  studyId: string;
  /** The crew server's base URL; '' is the origin the app is served from (web/sync/README.md). */
  server: string;
  /** This phone's bearer token for this study: sent to the server, never shown. */
  token: string;
  /** This phone's id on the crew server (the creator revokes phones by it). */
  phoneId: string;
  /** The device id this phone shared or joined with: the only events it pushes carry it. */
  device: string;
  /** True on the phone that shared the study: it holds the crew code and may revoke phones. */
  creator: boolean;
  /** Creator only: the crew code now in force (canonical), or null after it was stopped. */
  crewCode?: string | null;
  /** The server's pull cursor after the last stored page (opaque); null before the first pull. */
  cursor: string | null;
  /**
   * The highest seq of this phone's own events the server has acknowledged: own events are appended in
   * seq order and pushed oldest first, so every own event up to it is on the server.
   */
  pushedSeq: number;
  /** When a sync last went through (push and pull), ISO 8601 with offset. */
  lastSyncAt?: string;
  /** Set when the server refused a request: syncing this study waits for the user to try again. */
  stopped?: { at: string; message: string };
  /** When this phone shared or joined the study. */
  linkedAt: string;
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
  /** From version 4: keyed by studyId. */
  crewLinks: { key: string; value: CrewLink };
  /** From version 4: the other phones' events, keyed by event id. */
  crewEvents: { key: string; value: ObservationRecord; indexes: { byStudy: string } };
}
