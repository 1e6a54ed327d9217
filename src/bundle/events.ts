/**
 * Reading an event log: which entries count, which are voided, the core's Point[] for assess, each
 * collector's share and the likely duplicates.
 */
import type { ObservationRecord } from '../model/records.ts';
import type { Point } from '../model/types.ts';

export type EventStatus = 'counted' | 'voided' | 'void-record';

/** True for a void event (it withdraws another entry). */
export function isVoid(e: ObservationRecord): boolean {
  return e.voids !== undefined;
}

/** Ids of the entries withdrawn by some void in the log. */
export function voidedIds(events: readonly ObservationRecord[]): Set<string> {
  const out = new Set<string>();
  for (const e of events) if (e.voids !== undefined) out.add(e.voids);
  return out;
}

/** Status of every event, by id: `counted` entries, `voided` entries, and `void-record`s. */
export function statusOf(events: readonly ObservationRecord[]): Map<string, EventStatus> {
  const voided = voidedIds(events);
  const out = new Map<string, EventStatus>();
  for (const e of events) out.set(e.id, isVoid(e) ? 'void-record' : voided.has(e.id) ? 'voided' : 'counted');
  return out;
}

/** The counted entries in seq order. */
export function countedEntries(events: readonly ObservationRecord[]): ObservationRecord[] {
  const voided = voidedIds(events);
  return [...events]
    .sort((a, b) => a.seq - b.seq)
    .filter((e) => !isVoid(e) && !voided.has(e.id) && e.value !== undefined);
}

/** The counted entries as the statistics see them (seq order). */
export function pointsOf(events: readonly ObservationRecord[]): Point[] {
  return countedEntries(events).map((e) => {
    const p: Point = { value: e.value as number };
    if (e.censored) p.censored = true;
    if (e.stratum !== undefined) p.stratum = e.stratum;
    if (e.cluster !== undefined) p.cluster = e.cluster;
    return p;
  });
}

export interface LogCounts {
  /** Entries (counted + voided). */
  entries: number;
  counted: number;
  voided: number;
  voidRecords: number;
}

export function logCounts(events: readonly ObservationRecord[]): LogCounts {
  let counted = 0;
  let voided = 0;
  let voidRecords = 0;
  for (const s of statusOf(events).values()) {
    if (s === 'counted') counted++;
    else if (s === 'voided') voided++;
    else voidRecords++;
  }
  return { entries: counted + voided, counted, voided, voidRecords };
}

export interface CollectorShare {
  device: string;
  /** Entries this device recorded (counted + voided). */
  entries: number;
  /** Of those, still counted. */
  counted: number;
  /** Void events this device recorded. */
  voids: number;
  /** counted / all counted entries of the study (0 when none). */
  share: number;
}

/** Each collector's (device's) contribution, sorted by device. */
export function collectorShares(events: readonly ObservationRecord[]): CollectorShare[] {
  const status = statusOf(events);
  const by = new Map<string, CollectorShare>();
  let total = 0;
  for (const e of events) {
    let s = by.get(e.device);
    if (!s) {
      s = { device: e.device, entries: 0, counted: 0, voids: 0, share: 0 };
      by.set(e.device, s);
    }
    const st = status.get(e.id);
    if (st === 'void-record') s.voids++;
    else {
      s.entries++;
      if (st === 'counted') {
        s.counted++;
        total++;
      }
    }
  }
  const out = [...by.values()].sort((a, b) => (a.device < b.device ? -1 : a.device > b.device ? 1 : 0));
  for (const s of out) s.share = total === 0 ? 0 : s.counted / total;
  return out;
}

/**
 * The order in which likely duplicates list their ids (a reader's order, not the pooled log's, which is
 * pooled-order.ts): by time (`at` as an instant, to the millisecond), then `device` (code-unit order), then `id`.
 */
export function compareEvents(a: ObservationRecord, b: ObservationRecord): number {
  const ta = Date.parse(a.at);
  const tb = Date.parse(b.at);
  if (ta !== tb) return ta - tb;
  if (a.device !== b.device) return a.device < b.device ? -1 : 1;
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

export interface LikelyDuplicate {
  label: string;
  stratum?: string;
  cluster?: string;
  /** The counted entries with this label, by time, device and id (compareEvents). */
  ids: string[];
  devices: string[];
}

/**
 * Counted entries sharing (stratum, cluster, label) across two or more devices. Independent of `seq`, so a
 * log pooled by `merge` (re-sequenced) and the same log pooled on a phone (appended) give the same list:
 * groups in the order of their earliest entry, ids within a group by compareEvents.
 */
export function likelyDuplicates(events: readonly ObservationRecord[]): LikelyDuplicate[] {
  const voided = voidedIds(events);
  const counted = events
    .filter((e) => !isVoid(e) && !voided.has(e.id) && e.value !== undefined)
    .sort(compareEvents);
  const groups = new Map<string, ObservationRecord[]>();
  for (const e of counted) {
    if (e.label === undefined || e.label.trim() === '') continue;
    const key = JSON.stringify([e.stratum ?? null, e.cluster ?? null, e.label.trim()]);
    const g = groups.get(key);
    if (g) g.push(e);
    else groups.set(key, [e]);
  }
  const out: LikelyDuplicate[] = [];
  for (const g of groups.values()) {
    const devices = [...new Set(g.map((e) => e.device))].sort();
    if (devices.length < 2) continue;
    const first = g[0]!;
    const d: LikelyDuplicate = { label: first.label!.trim(), ids: g.map((e) => e.id), devices };
    if (first.stratum !== undefined) d.stratum = first.stratum;
    if (first.cluster !== undefined) d.cluster = first.cluster;
    out.push(d);
  }
  return out;
}
