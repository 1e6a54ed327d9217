/**
 * Pooling — answers "what does this study bundle add to the log already held, and may it be added at all?"
 *
 * The one rule behind both ways of pooling collectors' phones: `sure-enough merge` (merge.ts) and the
 * phone's import (web/handover/import.ts, written by web/storage/import.ts). Both call `poolBundle`, so a
 * file that one accepts the other accepts, a refusal reads the same on both, and both report the same
 * figures.
 *
 * Source: events are immutable and carry UUIDs, so pooling is a set union by id — a grow-only set, the
 * simplest conflict-free replicated data type (Shapiro, Preguiça, Baquero & Zawirski 2011, "Conflict-free
 * replicated data types", §3.3.1 G-Set): the result does not depend on the order in which files arrive,
 * and taking in the same file twice changes nothing.
 *
 * Rules, in order:
 * 1. A held study with another id is refused ("different studies").
 * 2. The same id with any difference in the setup (compared as canonical JSON, RFC 8785) is refused, naming
 *    each differing member: entries taken under different setups cannot be pooled.
 * 3. An event id present on both sides with different content (everything but `seq`) is refused: one of
 *    the files was altered.
 * 4. Otherwise the incoming events not held yet are added (in the file's order); those already held are
 *    counted as already present. Voids are events like any other: two voids of one entry from two phones
 *    are both kept — the entry stays voided once, the statistics read it once (events.ts), and the log
 *    shows both.
 * 5. On the union: likely duplicates (counted entries with the same stratum, cluster and label from two or
 *    more devices — flagged, never dropped), each collector's share, and the members of the study record
 *    outside the setup that differ (name, notes, createdAt…).
 *
 * Preconditions: `incoming` passed parseBundle; `held.events` are the held study's own events (ids unique).
 * What the two surfaces then do with the plan differs only where their storage differs (documented in
 * SCHEMA.md, "Pooling"): merge re-sequences the union by time, device and id and keeps the study record
 * created first; the phone's append-only store appends the added events after its last seq and keeps its
 * own study record.
 *
 * @example poolBundle({ study: undefined, events: [] }, bundle) // every event of the bundle is added
 */
import type { ObservationRecord, StudyRecord } from '../model/records.ts';
import { type Bundle, cleanEvent, cleanStudy } from './bundle.ts';
import { canonicalJson } from './canonical.ts';
import { type CollectorShare, collectorShares, type LikelyDuplicate, likelyDuplicates } from './events.ts';

/** What is already held: the study record (none when the study is new here) and its events. */
export interface HeldLog {
  study: StudyRecord | undefined;
  events: readonly ObservationRecord[];
}

/** The figures both surfaces show after pooling. */
export interface PoolReport {
  /** Events of the file not held before. */
  added: number;
  /** Events of the file already held (identical). */
  alreadyPresent: number;
  /** Members of the study record (outside the setup) that differ between the held record and the file's. */
  studyDiffers: string[];
  /** On the pooled log. */
  duplicates: LikelyDuplicate[];
  /** On the pooled log. */
  shares: CollectorShare[];
}

export type PoolPlan =
  | {
      ok: true;
      /** The file's events not held yet, in the file's order (the file's `seq` kept; sequencing is the caller's). */
      add: ObservationRecord[];
      report: PoolReport;
    }
  | { ok: false; message: string };

/** An event's content without its position in one log (`seq`) and without storage-only members. */
function contentOf(e: ObservationRecord): string {
  return canonicalJson({ ...cleanEvent(e), seq: 0 });
}

function refuseSetup(held: StudyRecord, incoming: StudyRecord): string | null {
  const sa = cleanStudy(held).setup as unknown as Record<string, unknown>;
  const sb = cleanStudy(incoming).setup as unknown as Record<string, unknown>;
  if (canonicalJson(sa) === canonicalJson(sb)) return null;
  const keys = [...new Set([...Object.keys(sa), ...Object.keys(sb)])].sort();
  const show = (v: unknown) => canonicalJson(v ?? null);
  const differ = keys.filter((k) => show(sa[k]) !== show(sb[k]));
  return `refused: study "${held.name}" has a different setup in this file (${differ
    .map((k) => `${k}: ${show(sa[k])} vs ${show(sb[k])} in this file`)
    .join('; ')}); entries taken under different setups cannot be pooled`;
}

function studyDiffers(held: StudyRecord | undefined, incoming: StudyRecord): string[] {
  if (held === undefined) return [];
  const a = cleanStudy(held) as unknown as Record<string, unknown>;
  const b = incoming as unknown as Record<string, unknown>;
  return [...new Set([...Object.keys(a), ...Object.keys(b)])]
    .filter((k) => k !== 'setup' && canonicalJson(a[k] ?? null) !== canonicalJson(b[k] ?? null))
    .sort();
}

/** Decides what `incoming` adds to `held` (see the module note); changes neither. */
export function poolBundle(held: HeldLog, incoming: Bundle): PoolPlan {
  const h = held.study;
  if (h !== undefined && h.id !== incoming.study.id)
    return {
      ok: false,
      message: `refused: different studies ("${h.name}" ${h.id} and "${incoming.study.name}" ${incoming.study.id}); only bundles of the same study can be merged`,
    };
  if (h !== undefined) {
    const message = refuseSetup(h, incoming.study);
    if (message !== null) return { ok: false, message };
  }
  const byId = new Map<string, ObservationRecord>();
  for (const e of held.events) byId.set(e.id, e);
  const add: ObservationRecord[] = [];
  let alreadyPresent = 0;
  for (const e of incoming.events) {
    const have = byId.get(e.id);
    if (have === undefined) add.push(e);
    else if (contentOf(have) === contentOf(e)) alreadyPresent++;
    else
      return {
        ok: false,
        message: `refused: event ${e.id} (seq ${e.seq} in this file) differs from the event with the same id already held; one of the files was altered`,
      };
  }
  const pooled = add.length === 0 ? held.events : [...held.events, ...add];
  return {
    ok: true,
    add,
    report: {
      added: add.length,
      alreadyPresent,
      studyDiffers: studyDiffers(h, incoming.study),
      duplicates: likelyDuplicates(pooled),
      shares: collectorShares(pooled),
    },
  };
}
