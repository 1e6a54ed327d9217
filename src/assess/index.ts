/**
 * The assessment pipeline's public face (see README.md in this folder): the batch `assess`, the running
 * assessment every surface shares, replay, and the target helpers.
 */
import type { AnalysisSetup, Assessment, Point } from '../model/types.ts';
import { RunningAssessment } from './running.ts';

export type { Details, Estimator, Guard, Projection } from './estimator.ts';
export type { MoreMemory } from './more.ts';
export { type AssessOptions, DEFAULT_MIN, type Subject } from './pipeline.ts';
export { type PassFailMemo, type ReplayResult, replaySequence } from './replay.ts';
export { RunningAssessment, SERIES_MAX, type SeriesPoint } from './running.ts';
export { type StratumProgress, strataProgress } from './strata-progress.ts';
export { checkTarget, effectiveSided, halfWidth } from './target.ts';

/**
 * Assess a list of counted entries in entry order (the command line's batch form): the same running
 * assessment the phone keeps, so the figures — the smoothed "how many more" included — are the app's.
 */
export function assess(points: readonly Point[], setup: AnalysisSetup): Assessment {
  return new RunningAssessment(setup, points).assessment;
}
