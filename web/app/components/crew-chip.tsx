/**
 * The field screen's crew button, in the status row: the study's sync state at a glance ("Crew · 3
 * waiting"); one tap opens the crew panel (share, crew code, the crew's pooled verdict). While it is on
 * screen the study syncs now and every minute (web/sync/index.ts). The panel's code (the QR encoder, the
 * requests) is loaded on the first tap, so the app shell stays small.
 */
import type { ComponentType } from 'preact';
import { useEffect, useState } from 'preact/hooks';
import { syncWord } from '../../core-light.ts';
import { useStore } from '../../state/store.ts';
import { watchStudy } from '../../sync/index.ts';
import { syncStatus } from '../../sync/status.ts';

type PanelProps = { studyId: string; onClose(): void };

export function CrewChip({ studyId }: { studyId: string }) {
  const s = useStore(syncStatus)[studyId];
  const [Panel, setPanel] = useState<ComponentType<PanelProps> | null>(null);
  const [open, setOpen] = useState(false);
  useEffect(() => watchStudy(studyId), [studyId]);
  // short, so that it shares the status row with the position and chart chips: the time of the last
  // sync is in the panel's status line, one tap away
  return (
    <>
      <button
        type="button"
        class={`chip crew-chip ${s?.stopped !== undefined ? 'coarse' : ''}`}
        aria-haspopup="dialog"
        data-testid="crew-chip"
        onClick={async () => {
          if (!Panel) {
            const m = await import('./crew-panel.tsx');
            setPanel(() => m.CrewPanel);
          }
          setOpen(true);
        }}
      >
        {s ? `Crew · ${syncWord(s)}` : 'Crew'}
      </button>
      {open && Panel && <Panel studyId={studyId} onClose={() => setOpen(false)} />}
    </>
  );
}
