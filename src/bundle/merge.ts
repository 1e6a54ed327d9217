/**
 * Pooling several collectors' phones offline: the union of two bundles of the same study.
 *
 * Events are immutable and carry UUIDs, so merging is a set union by id (a grow-only set, the simplest
 * conflict-free replicated data type; Shapiro, Preguiça, Baquero & Zawirski 2011, "Conflict-free
 * replicated data types", §3.3.1 G-Set). Rules:
 * - Same study id and identical setup (compared as canonical JSON, RFC 8785) → merged. A different study
 *   id, or the same id with any difference in the setup, is refused with a message.
 * - An id present in both with different content is refused (one of the files was altered).
 * - If the second bundle adds nothing, the first is returned unchanged: importing the same bundle twice
 *   changes nothing.
 * - Otherwise all events are re-sequenced deterministically: by time (`at` as an instant, to the
 *   millisecond), then by `device` (code-unit order), then by `id`; seq becomes 1, 2, 3… in that order.
 *   A void whose time sorts before the entry it withdraws still withdraws it (voids act by id).
 * - The study records may differ outside the setup (name, notes, createdAt — e.g. bundles built on two
 *   desks): the one created first is kept (ties: the smaller canonical JSON), and the differing members
 *   are listed in the report.
 * - Likely duplicates — counted entries with the same stratum, cluster and label recorded on two or more
 *   devices — are flagged, never dropped.
 * - Each collector's (device's) share of the counted entries is reported.
 */
import type { ObservationRecord } from '../model/records.ts';
import { type Bundle, makeBundle } from './bundle.ts';
import { canonicalJson } from './canonical.ts';
import { type CollectorShare, collectorShares, countedEntries } from './events.ts';

export interface LikelyDuplicate {
  label: string;
  stratum?: string;
  cluster?: string;
  /** The counted entries with this label, in seq order of the merged log. */
  ids: string[];
  devices: string[];
}

export interface MergeReport {
  /** Events of the second bundle not already in the first. */
  added: number;
  /** Events of the second bundle already in the first (identical). */
  alreadyPresent: number;
  /** Members of the study record (outside the setup) that differ between the bundles. */
  studyDiffers: string[];
  duplicates: LikelyDuplicate[];
  shares: CollectorShare[];
}

export type MergeResult = { ok: true; bundle: Bundle; report: MergeReport } | { ok: false; message: string };

/** Deterministic order of the merged log (see the module note). */
export function compareEvents(a: ObservationRecord, b: ObservationRecord): number {
  const ta = Date.parse(a.at);
  const tb = Date.parse(b.at);
  if (ta !== tb) return ta - tb;
  if (a.device !== b.device) return a.device < b.device ? -1 : 1;
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/** Counted entries sharing (stratum, cluster, label) across two or more devices. */
export function likelyDuplicates(events: readonly ObservationRecord[]): LikelyDuplicate[] {
  const groups = new Map<string, ObservationRecord[]>();
  for (const e of countedEntries(events)) {
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

/** Merges `incoming` into `base` (both already validated). */
export function mergeBundles(base: Bundle, incoming: Bundle): MergeResult {
  if (base.study.id !== incoming.study.id)
    return {
      ok: false,
      message: `refused: different studies ("${base.study.name}" ${base.study.id} and "${incoming.study.name}" ${incoming.study.id}); only bundles of the same study can be merged`,
    };
  const sa = base.study.setup as unknown as Record<string, unknown>;
  const sb = incoming.study.setup as unknown as Record<string, unknown>;
  if (canonicalJson(sa) !== canonicalJson(sb)) {
    const keys = [...new Set([...Object.keys(sa), ...Object.keys(sb)])].sort();
    const differ = keys.filter((k) => canonicalJson(sa[k] ?? null) !== canonicalJson(sb[k] ?? null));
    return {
      ok: false,
      message: `refused: study "${base.study.name}" has a different setup in the two bundles (${differ
        .map((k) => `${k}: ${canonicalJson(sa[k] ?? null)} vs ${canonicalJson(sb[k] ?? null)}`)
        .join('; ')}); entries taken under different setups cannot be pooled`,
    };
  }
  const byId = new Map<string, ObservationRecord>();
  const canon = new Map<string, string>();
  for (const e of base.events) {
    byId.set(e.id, e);
    canon.set(e.id, canonicalJson({ ...e, seq: 0 }));
  }
  let added = 0;
  let alreadyPresent = 0;
  for (const e of incoming.events) {
    const have = canon.get(e.id);
    if (have === undefined) {
      byId.set(e.id, e);
      canon.set(e.id, '');
      added++;
    } else if (have === '' || have === canonicalJson({ ...e, seq: 0 })) alreadyPresent++;
    else
      return {
        ok: false,
        message: `refused: event ${e.id} (seq ${e.seq} in the second bundle) differs between the bundles; one of the files was altered`,
      };
  }
  const studyA = base.study as unknown as Record<string, unknown>;
  const studyB = incoming.study as unknown as Record<string, unknown>;
  const studyDiffers = [...new Set([...Object.keys(studyA), ...Object.keys(studyB)])]
    .filter((k) => k !== 'setup' && canonicalJson(studyA[k] ?? null) !== canonicalJson(studyB[k] ?? null))
    .sort();
  let bundle: Bundle;
  if (added === 0) bundle = base;
  else {
    const events = [...byId.values()].sort(compareEvents).map((e, i) => ({ ...e, seq: i + 1 }));
    const ta = Date.parse(base.study.createdAt);
    const tb = Date.parse(incoming.study.createdAt);
    const keepIncoming = tb < ta || (tb === ta && canonicalJson(studyB) < canonicalJson(studyA));
    bundle = makeBundle(keepIncoming ? incoming.study : base.study, events);
  }
  return {
    ok: true,
    bundle,
    report: {
      added,
      alreadyPresent,
      studyDiffers,
      duplicates: likelyDuplicates(bundle.events),
      shares: collectorShares(bundle.events),
    },
  };
}
