/** The few shapes web/design reads, from the core's public types (web/core.ts). */
import type { AnalysisSetup } from '../core.ts';

export type { Assessment, ObservationRecord, Point } from '../core.ts';

/** Any stored study: web/design reads only its setup. */
export interface StoredStudyLike {
  setup: AnalysisSetup;
}
