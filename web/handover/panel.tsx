/**
 * The Report screen's hand-over panel: export the study (bundle, CSV + dictionary, GeoJSON, Darwin Core,
 * printable report) through the share sheet or a download, open the report for printing, and see each
 * collector's share and likely duplicates. The "not yet exported" figure drops only after a delivery that
 * carried the whole log (bundle or CSV) completed: the export is recorded (web/storage/exports.ts) with the
 * last seq it covered.
 */
import { useEffect, useState } from 'preact/hooks';
import type { ReportSlotProps } from '../app/slots.ts';
import { exportedUpTo, recordExport } from '../storage/exports.ts';
import { deliver } from './deliver.ts';
import type { ExportFormat } from './files.ts';

/** Formats that carry the complete event log (kept in step with files.ts BACKUP_FORMATS). */
const BACKUP: readonly ExportFormat[] = ['bundle', 'csv'];

/** The export code is loaded on first use (it is not needed to record entries; keeps the shell small). */
const loadFiles = () => import('./files.ts');

const LABELS: Record<ExportFormat, string> = {
  bundle: 'Study bundle (backup, pooling)',
  csv: 'Spreadsheet (CSV + data dictionary)',
  geojson: 'Map (GeoJSON)',
  dwc: 'Darwin Core tables',
  report: 'Report file (HTML)',
};

export function HandoverPanel({ study, records, lastSeq }: ReportSlotProps) {
  const [exported, setExported] = useState<number | null>(null);
  const [busy, setBusy] = useState(false);
  const [status, setStatus] = useState<{ ok: boolean; text: string } | null>(null);

  useEffect(() => {
    let live = true;
    exportedUpTo(study.id).then(
      (v) => live && setExported(v),
      () => live && setExported(0),
    );
    return () => {
      live = false;
    };
  }, [study.id]);

  const [lib, setLib] = useState<Awaited<ReturnType<typeof loadFiles>> | null>(null);
  useEffect(() => {
    let live = true;
    loadFiles().then((m) => live && setLib(m));
    return () => {
      live = false;
    };
  }, []);
  const shares = lib ? lib.collectorShares(records) : [];
  const dups = lib ? lib.likelyDuplicates(records) : [];
  const pending = exported === null ? null : Math.max(0, lastSeq - exported);

  async function run(format: ExportFormat) {
    setStatus(null);
    const { buildExport } = await loadFiles();
    const built = await buildExport(format, study, records);
    if (!built.ok) {
      setStatus({ ok: false, text: built.message });
      return;
    }
    setBusy(true);
    try {
      const how = await deliver(built.files, study.name);
      if (how === 'cancelled') {
        setStatus({ ok: false, text: 'Not exported: the share sheet was closed.' });
        return;
      }
      const done = `${how === 'shared' ? 'Shared' : 'Downloaded'}: ${built.files.map((f) => f.name).join(', ')}`;
      if (BACKUP.includes(format)) {
        try {
          await recordExport(study.id, lastSeq, format);
          setExported(Math.max(exported ?? 0, lastSeq));
        } catch (err) {
          // The files did leave the phone; only the note of it could not be stored (e.g. storage full).
          setStatus({
            ok: true,
            text: `${done}. This phone could not note the export (${(err as Error).message}), so the "not yet exported" count stays.`,
          });
          return;
        }
      }
      setStatus({ ok: true, text: done });
    } catch (err) {
      setStatus({ ok: false, text: `Not exported: ${(err as Error).message}` });
    } finally {
      setBusy(false);
    }
  }

  async function openReport() {
    // Open the window within the tap (popup blockers), fill it once the report is built.
    const w = window.open('', '_blank');
    const { buildExport } = await loadFiles();
    const built = await buildExport('report', study, records);
    if (!built.ok) return;
    if (!w) {
      setStatus({ ok: false, text: 'The browser blocked the report window; use "Report file" instead.' });
      return;
    }
    // A window opened from this page (about:blank, blob:) inherits the app's Content Security Policy,
    // which refuses inline <style>: the report's style sheet is applied through the CSSOM instead.
    const html = built.files[0]!.text;
    const css = /<style>([\s\S]*?)<\/style>/.exec(html)?.[1] ?? '';
    w.document.open();
    w.document.write(html.replace(/<style>[\s\S]*?<\/style>/, ''));
    w.document.close();
    const sheet = new (w as typeof window).CSSStyleSheet();
    sheet.replaceSync(css);
    w.document.adoptedStyleSheets = [sheet];
  }

  return (
    <div class="handover" data-testid="handover">
      <p class={`backup ${pending ? 'pending' : ''}`} data-testid="handover-pending">
        {pending === null
          ? 'Checking exports…'
          : pending === 0
            ? 'Everything is in an export (bundle or CSV).'
            : `${pending} ${pending === 1 ? 'record' : 'records'} not yet in a bundle or CSV export.`}
      </p>
      <div class="actions">
        {(Object.keys(LABELS) as ExportFormat[]).map((f) => (
          <button
            key={f}
            type="button"
            class="btn"
            disabled={busy}
            data-testid={`export-${f}`}
            onClick={() => void run(f)}
          >
            {LABELS[f]}
          </button>
        ))}
        <button type="button" class="btn" onClick={() => void openReport()} data-testid="open-report">
          Open printable report
        </button>
      </div>
      {status && (
        <p role="status" class={status.ok ? 'sub' : 'error'} data-testid="handover-status">
          {status.text}
        </p>
      )}
      {shares.length > 0 && (
        <table class="shares">
          <caption>Collectors</caption>
          <thead>
            <tr>
              <th scope="col">Device</th>
              <th scope="col">Counted</th>
              <th scope="col">Share</th>
            </tr>
          </thead>
          <tbody>
            {shares.map((s) => (
              <tr key={s.device}>
                <td>{s.device}</td>
                <td>{s.counted}</td>
                <td>{`${Math.round(s.share * 1000) / 10} %`}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {dups.length > 0 && (
        <div class="duplicates" role="note">
          <p>Likely duplicates (same label from two phones; both kept — void one if it is a repeat):</p>
          <ul>
            {dups.map((d) => (
              <li key={d.ids.join()}>
                {d.label}
                {d.stratum ? ` (stratum ${d.stratum})` : ''}: {d.devices.join(', ')}
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
