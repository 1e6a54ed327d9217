/**
 * The hand-over's seam to the pure core, loaded lazily (dynamic import from panel.tsx / import-panel.tsx):
 * bundle validation, merge helpers and the export formats are not needed to record entries, so they stay
 * out of the app shell's first download. Imports only the core's bundle and export barrels (plus types).
 */
export * from '../../src/bundle/index.ts';
export * from '../../src/export/index.ts';
export type { ObservationRecord, StudyRecord } from '../../src/model/records.ts';
