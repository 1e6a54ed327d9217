/**
 * The export files for one study, built by the pure core from the stored records (web/core.ts).
 * Names: `<study name slug>-<date>.<ext>`, safe on every file system.
 */

import { studySep } from '../app/number-style.ts';
import {
  type Bundle,
  coverageStatement,
  dataDictionaryCsv,
  dwcTables,
  eventsCsv,
  geoJsonText,
  makeBundle,
  type ObservationRecord,
  reportHtml,
  type StudyRecord,
  serializeBundle,
} from './core-handover.ts';
import type { OutFile } from './deliver.ts';

export type ExportFormat = 'bundle' | 'csv' | 'geojson' | 'dwc' | 'report';

/** Formats that carry the complete event log: only these count as a backup ("not yet exported"); panel.tsx keeps a copy. */
export const BACKUP_FORMATS: readonly ExportFormat[] = ['bundle', 'csv'];

export function fileStem(study: StudyRecord, now = new Date()): string {
  const slug =
    study.name
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .replace(/[^A-Za-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .toLowerCase()
      .slice(0, 40) || 'study';
  const d = `${now.getFullYear()}-${String(now.getMonth() + 1).padStart(2, '0')}-${String(now.getDate()).padStart(2, '0')}`;
  return `${slug}-${d}`;
}

export function bundleOf(study: StudyRecord, records: readonly ObservationRecord[]): Promise<Bundle> {
  return makeBundle(study, records);
}

export type Built = { ok: true; files: OutFile[] } | { ok: false; message: string };

export async function buildExport(
  format: ExportFormat,
  study: StudyRecord,
  records: readonly ObservationRecord[],
): Promise<Built> {
  const bundle = await bundleOf(study, records);
  const stem = fileStem(study);
  switch (format) {
    case 'bundle':
      return {
        ok: true,
        files: [{ name: `${stem}.bundle.json`, type: 'application/json', text: serializeBundle(bundle) }],
      };
    case 'csv':
      return {
        ok: true,
        files: [
          { name: `${stem}.csv`, type: 'text/csv', text: eventsCsv(bundle) },
          { name: `${stem}-dictionary.csv`, type: 'text/csv', text: dataDictionaryCsv(bundle) },
        ],
      };
    case 'geojson':
      if (!records.some((r) => r.position))
        return { ok: false, message: 'No entry has a position yet, so there is nothing to map.' };
      return {
        ok: true,
        files: [{ name: `${stem}.geojson`, type: 'application/geo+json', text: geoJsonText(bundle) }],
      };
    case 'dwc': {
      const r = dwcTables(bundle);
      if (!r.ok) return { ok: false, message: r.message };
      return {
        ok: true,
        files: [
          { name: `${stem}-event.csv`, type: 'text/csv', text: r.event },
          { name: `${stem}-occurrence.csv`, type: 'text/csv', text: r.occurrence },
        ],
      };
    }
    case 'report':
      return {
        ok: true,
        files: [
          {
            name: `${stem}-report.html`,
            type: 'text/html',
            // the report's words use the separator the study's screens show
            text: await reportHtml(bundle, {
              coverage: coverageStatement(study.setup),
              decimalSeparator: studySep(study.setup),
            }),
          },
        ],
      };
  }
}

export { collectorShares, likelyDuplicates } from './core-handover.ts';
// One lazy chunk for all hand-over code (two chunks would push their shared modules into the shell).
export { importBundleText } from './import.ts';
