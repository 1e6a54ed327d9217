/** The study bundle: schema, checksum, validation, pooling and merge, and reading an event log (see SCHEMA.md). */
export {
  BUNDLE_FORMAT,
  BUNDLE_VERSION,
  type Bundle,
  bundleChecksum,
  cleanEvent,
  cleanStudy,
  eventLogHash,
  makeBundle,
  serializeBundle,
} from './bundle.ts';
export { canonicalJson } from './canonical.ts';
export { sha256Hex } from './digest.ts';
export {
  type CollectorShare,
  collectorShares,
  compareEvents,
  countedEntries,
  type EventStatus,
  isVoid,
  type LikelyDuplicate,
  type LogCounts,
  likelyDuplicates,
  logCounts,
  pointsOf,
  statusOf,
  voidedIds,
} from './events.ts';
export { derivedUuid } from './ids.ts';
export { type MergeReport, type MergeResult, mergeBundles } from './merge.ts';
export { type HeldLog, type PoolPlan, type PoolReport, poolBundle } from './pool.ts';
export { pooledOrder } from './pooled-order.ts';
export {
  type BundleResult,
  eventProblems,
  isIsoTimeWithOffset,
  isUuid,
  parseBundle,
  studyProblems,
  validateBundle,
} from './validate.ts';
