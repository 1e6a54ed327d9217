/** The study bundle: schema, checksum, validation, merge, and reading an event log (see SCHEMA.md). */
export {
  BUNDLE_FORMAT,
  BUNDLE_VERSION,
  type Bundle,
  bundleChecksum,
  cleanEvent,
  eventLogHash,
  makeBundle,
  serializeBundle,
} from './bundle.ts';
export { canonicalJson } from './canonical.ts';
export {
  type CollectorShare,
  collectorShares,
  countedEntries,
  type EventStatus,
  isVoid,
  type LogCounts,
  logCounts,
  pointsOf,
  statusOf,
  voidedIds,
} from './events.ts';
export { derivedUuid } from './ids.ts';
export {
  compareEvents,
  type LikelyDuplicate,
  likelyDuplicates,
  type MergeReport,
  type MergeResult,
  mergeBundles,
} from './merge.ts';
export { sha256Hex, utf8Bytes } from './sha256.ts';
export { type BundleResult, isIsoTimeWithOffset, isUuid, parseBundle, validateBundle } from './validate.ts';
