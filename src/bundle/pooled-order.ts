/**
 * The pooled order — answers "in what order do the events of several phones make one log?"
 *
 * One order for every place that pools phones: `merge` and the crew view (src/sync). Sequential stopping
 * rules read the log in order, so two surfaces that pooled the same events must read them in the same
 * order to give the same verdict.
 *
 * Rule: each phone's events keep that phone's own order (its `seq`, ties by id), and the phones are
 * interleaved by rank — the first event of every phone, then the second of every phone, and so on; within
 * one rank, by device id. Never by clock: a phone whose clock is wrong (set to another zone, or reset to
 * 2000 after a flat battery) still has its events read in the order it took them, and its place among the
 * others does not move. Interleaving by rank rather than by raw `seq` keeps the order unchanged when a
 * pooled log is pooled again: a merge renumbers `seq` but keeps each phone's events in their order, so
 * every rank stays where it was.
 *
 * Cost: O(N log N).
 *
 * @example pooledOrder([a1, a2, b1]) // [a1, b1, a2] when device "a" < "b"
 */
import type { ObservationRecord } from '../model/records.ts';

const byText = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

export function pooledOrder<E extends ObservationRecord>(events: readonly E[]): E[] {
  const byDevice = new Map<string, E[]>();
  for (const e of events) {
    const own = byDevice.get(e.device);
    if (own === undefined) byDevice.set(e.device, [e]);
    else own.push(e);
  }
  const ranked: { e: E; rank: number }[] = [];
  for (const own of byDevice.values()) {
    own.sort((a, b) => a.seq - b.seq || byText(a.id, b.id));
    for (const [rank, e] of own.entries()) ranked.push({ e, rank });
  }
  ranked.sort((a, b) => a.rank - b.rank || byText(a.e.device, b.e.device) || byText(a.e.id, b.e.id));
  return ranked.map((r) => r.e);
}
