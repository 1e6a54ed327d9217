/**
 * Mount points for features built elsewhere: web/handover/* registers export / import actions for the
 * Report screen, web/design/* registers extra setup sections. Each registers a component here at import.
 */
import type { ComponentType } from 'preact';
import type { ObservationRecord } from '../core.ts';
import type { StoredStudy } from '../storage/schema.ts';

export interface ReportSlotProps {
  study: StoredStudy;
  records: readonly ObservationRecord[];
  /** Highest seq in the log (what an export made now would cover). */
  lastSeq: number;
}
export const reportSlots: ComponentType<ReportSlotProps>[] = [];
/** Components shown on the Studies screen below the list (e.g. "Import a study"). */
export const studiesSlots: ComponentType[] = [];
