/**
 * The public face of the pure core — what web/ (and other edges) import. Others may add export lines.
 */

export {
  type AssessOptions,
  assess,
  checkTarget,
  DEFAULT_MIN,
  halfWidth,
  RunningAssessment,
  SERIES_MAX,
  type SeriesPoint,
  type StratumProgress,
  strataProgress,
} from './assess/index.ts';
export {
  RUNNING_SNAPSHOT_VERSION,
  type RunningSnapshot,
  restoreRunning,
  snapshotFits,
  snapshotRunning,
} from './assess/snapshot.ts';
export { clusterRatioMean } from './design/cluster-ratio-mean.ts';
export { compositeUcl } from './design/composite-ucl.ts';
export { designEffect } from './design/design-effect.ts';
export { kaplanMeierMean } from './design/kaplan-meier-mean.ts';
export { neymanAllocation } from './design/neyman-allocation.ts';
export { formatStrata, parseStrata } from './design/strata-spec.ts';
export { stratifiedMean } from './design/stratified-mean.ts';
export { whereNext } from './design/where-next.ts';
export type * from './model/records.ts';
export type * from './model/types.ts';
export { fixedPointSampleSize } from './plan/fixed-point-sample-size.ts';
export { kupperHafnerSampleSize } from './plan/kupper-hafner-assurance.ts';
export { proportionSampleSize } from './plan/proportion-sample-size.ts';
export { agrestiCoullInterval } from './stats/agresti-coull-interval.ts';
export { chebyshevBound } from './stats/chebyshev-bound.ts';
export { clopperPearsonInterval } from './stats/clopper-pearson-interval.ts';
export { dispersionIndexTest } from './stats/dispersion-index-test.ts';
export { normalQuantile } from './stats/distributions.ts';
export { garwoodInterval } from './stats/garwood-poisson-interval.ts';
export { hypergeometricBounds } from './stats/hypergeometric-bounds.ts';
export { jeffreysInterval } from './stats/jeffreys-interval.ts';
export { landH, landInterval } from './stats/land-interval.ts';
export { modifiedCoxInterval } from './stats/modified-cox-interval.ts';
export { quasiPoissonInterval } from './stats/quasi-poisson-interval.ts';
export { RunningSummary } from './stats/running-summary.ts';
export { studentTInterval } from './stats/student-t-interval.ts';
export { wilsonCcInterval } from './stats/wilson-cc-interval.ts';
export { wilsonInterval } from './stats/wilson-interval.ts';
export {
  minimumBeforeVerdict,
  ruleWarnings,
  type SprtModel,
  sprtBoundaries,
  sprtFixedSize,
  sprtMaxN,
  sprtModelOf,
  sprtOperatingCharacteristic,
  strictCost,
} from './stop/index.ts';
export * from './sync/index.ts';
