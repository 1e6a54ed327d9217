/**
 * What `sure-enough merge` followed by `sure-enough assess` gives for the logs of several phones (not a test
 * file): each log written as a bundle, merged in turn by mergeBundles, the merged log's counted entries
 * assessed as the command line reads a bundle (pointsOf, then assess). The independent route the crew
 * view is compared with (test/core/sync, test/server).
 */
import { assess } from '../../src/assess/index.ts';
import { type Bundle, makeBundle } from '../../src/bundle/bundle.ts';
import { pointsOf } from '../../src/bundle/events.ts';
import { mergeBundles } from '../../src/bundle/merge.ts';
import type { ObservationRecord, StudyRecord } from '../../src/model/records.ts';
import type { Assessment } from '../../src/model/types.ts';

/** The phones' logs pooled as `merge` pools their bundles. */
export async function mergedBundle(st: StudyRecord, logs: readonly ObservationRecord[][]): Promise<Bundle> {
  let bundle = await makeBundle(st, logs[0]!);
  for (const log of logs.slice(1)) {
    const r = await mergeBundles(bundle, await makeBundle(st, log));
    if (!r.ok) throw new Error(r.message);
    bundle = r.bundle;
  }
  return bundle;
}

/** `assess` on the merged bundle. */
export async function mergedAssessment(
  st: StudyRecord,
  logs: readonly ObservationRecord[][],
): Promise<Assessment> {
  return assess(pointsOf((await mergedBundle(st, logs)).events), st.setup);
}
