/**
 * `sure-enough merge`: the union of two bundles of the same study, as one new bundle.
 *
 * What may be pooled and what is added is decided by the one pooling rule (pool.ts, shared with the phone's
 * import): refusals, union by id, voids kept, likely duplicates flagged, collectors' shares. This file adds
 * only what a merged *file* needs:
 * - If the second bundle adds nothing, the first is returned unchanged: merging the same bundle twice
 *   changes nothing.
 * - Otherwise all events are re-sequenced in the pooled order (pooled-order.ts: each phone's events in its
 *   own order, phones interleaved by rank, never by clock — the order the crew view reads too); seq becomes
 *   1, 2, 3… in that order, so the result does not depend on which bundle came first. A void that sorts
 *   before the entry it withdraws still withdraws it (voids act by id). The phone's import instead appends
 *   after its last seq (its store is append-only); the set of events and every order-free figure are the
 *   same.
 * - The study records may differ outside the setup (name, notes, createdAt — e.g. bundles built on two
 *   desks): the one created first is kept (ties: the smaller canonical JSON), and the differing members
 *   are listed in the report.
 */
import { type Bundle, makeBundle } from './bundle.ts';
import { canonicalJson } from './canonical.ts';
import { type PoolReport, poolBundle } from './pool.ts';
import { pooledOrder } from './pooled-order.ts';

export type MergeReport = PoolReport;

export type MergeResult = { ok: true; bundle: Bundle; report: MergeReport } | { ok: false; message: string };

/** Merges `incoming` into `base` (both already validated). */
export async function mergeBundles(base: Bundle, incoming: Bundle): Promise<MergeResult> {
  const plan = poolBundle({ study: base.study, events: base.events }, incoming);
  if (!plan.ok) return plan;
  if (plan.add.length === 0) return { ok: true, bundle: base, report: plan.report };
  const events = pooledOrder([...base.events, ...plan.add]).map((e, i) => ({ ...e, seq: i + 1 }));
  const ta = Date.parse(base.study.createdAt);
  const tb = Date.parse(incoming.study.createdAt);
  const keepIncoming = tb < ta || (tb === ta && canonicalJson(incoming.study) < canonicalJson(base.study));
  const bundle = await makeBundle(keepIncoming ? incoming.study : base.study, events);
  return { ok: true, bundle, report: plan.report };
}
