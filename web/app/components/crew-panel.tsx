/**
 * The crew panel (opened from the field screen's crew button): share the study with a crew, or — once
 * shared or joined — its sync state, the crew's pooled verdict and, on the phone that shared it, the crew
 * code as text and as a QR code (a join link on this app's own origin), a new code, stopping the code and
 * removing a phone. Loaded on first use (web/app/components/crew-chip.tsx).
 */
import { useEffect, useState } from 'preact/hooks';
import type { CrewPhone, CrewView } from '../../core.ts';
import { formatCrewCode, syncLine } from '../../core-light.ts';
import { useStore } from '../../state/store.ts';
import { getLink } from '../../storage/crew.ts';
import type { CrewLink, StoredStudy } from '../../storage/schema.ts';
import { getStudy } from '../../storage/studies.ts';
import { crewPhones, newCode, revokePhone, shareStudy, stopCode } from '../../sync/crew-actions.ts';
import { refreshStatus, resumeSync, syncStudy } from '../../sync/engine.ts';
import { syncStatus } from '../../sync/status.ts';
import { crewViewOf } from '../../sync/view.ts';
import { CrewQr } from './crew-qr.tsx';
import { CrewVerdict } from './crew-verdict.tsx';
import { Modal } from './modal.tsx';

/** The link a second phone scans: this app's own origin, the studies screen with the join form filled. */
export function joinUrl(code: string): string {
  return `${window.location.origin}${window.location.pathname}#/?join=${code}`;
}

type Msg = { ok: boolean; text: string } | null;
type Result = { ok: boolean; message?: string } | undefined;

export function CrewPanel({ studyId, onClose }: { studyId: string; onClose(): void }) {
  const [study, setStudy] = useState<StoredStudy | null>(null);
  const [link, setLink] = useState<CrewLink | null | undefined>(undefined);
  const [view, setView] = useState<CrewView | null>(null);
  const [busy, setBusy] = useState(false);
  const [msg, setMsg] = useState<Msg>(null);
  const status = useStore(syncStatus)[studyId];
  const stopped = status ? status.stopped : link?.stopped?.message;

  const reread = async () => {
    const [s, l] = await Promise.all([getStudy(studyId), getLink(studyId)]);
    setStudy(s ?? null);
    setLink(l ?? null);
    if (l) setView(await crewViewOf(studyId));
  };
  // opening the panel asks for the crew's latest: a sync now (the minute's tick may be far off)
  useEffect(() => {
    void syncStudy(studyId, 'open').catch(() => undefined);
  }, [studyId]);
  // every finished sync changes the status: read the link and the pooled events again
  useEffect(() => {
    void reread().catch((err) => setMsg({ ok: false, text: (err as Error).message }));
  }, [studyId, status?.lastSyncAt, status?.stopped, status?.waiting, status?.syncing]);

  const run = async (fn: () => Promise<unknown>, done?: string) => {
    setBusy(true);
    setMsg(null);
    try {
      const r = (await fn()) as Result;
      if (r && !r.ok) setMsg({ ok: false, text: r.message ?? '' });
      else if (done) setMsg({ ok: true, text: done });
      await reread();
    } catch (err) {
      setMsg({ ok: false, text: (err as Error).message });
    } finally {
      setBusy(false);
    }
  };

  return (
    <Modal title="Crew" onClose={onClose}>
      <div class="crew-panel" data-testid="crew-panel">
        {link === null && study && (
          <section aria-label="Share">
            <p>
              Share this study with your crew: other phones join with a code, and everyone’s entries pool into
              one crew verdict whenever the phones have signal. Entries are always saved on each phone first.
            </p>
            <button
              type="button"
              class="btn primary big"
              disabled={busy || !!study.demo}
              onClick={() =>
                run(async () => {
                  const r = await shareStudy(studyId);
                  return r.ok ? { ok: true } : r;
                }, 'Shared. Show the crew code to the other phones.')
              }
            >
              Share with crew
            </button>
            {study.demo && <p class="sub">The demo holds invented data and is not shared.</p>}
          </section>
        )}
        {link && (
          <>
            <div class="crew-sync">
              <p role="status" data-testid="crew-sync-status" class={stopped ? 'error' : ''}>
                {status ? syncLine(status) : (stopped ?? 'checking…')}
              </p>
              {stopped !== undefined ? (
                <button
                  type="button"
                  class="btn"
                  disabled={busy}
                  onClick={() => run(async () => resumeSync(studyId))}
                >
                  Try again
                </button>
              ) : (
                <button
                  type="button"
                  class="btn"
                  disabled={busy}
                  onClick={() =>
                    run(async () => syncStudy(studyId, 'manual').then(() => refreshStatus(studyId)))
                  }
                >
                  Sync now
                </button>
              )}
            </div>
            {view && study && <CrewVerdict view={view} study={study} ownDevice={link.device} />}
            {link.creator && <CrewCodeSection link={link} busy={busy} run={run} />}
          </>
        )}
        {msg && (
          <p role={msg.ok ? 'status' : 'alert'} class={msg.ok ? 'sub' : 'error'} data-testid="crew-msg">
            {msg.text}
          </p>
        )}
        <div class="actions">
          <button type="button" class="btn" onClick={onClose}>
            Close
          </button>
        </div>
      </div>
    </Modal>
  );
}

type Run = (fn: () => Promise<unknown>, done?: string) => Promise<void>;

function CrewCodeSection({ link, busy, run }: { link: CrewLink; busy: boolean; run: Run }) {
  const [phones, setPhones] = useState<CrewPhone[] | null>(null);
  const [you, setYou] = useState('');
  const id = link.studyId;
  const loadPhones = async () => {
    const r = await crewPhones(id);
    if (r.ok) {
      setPhones(r.value.phones);
      setYou(r.value.you);
    }
    return r.ok ? { ok: true } : r;
  };
  const code = link.crewCode ?? null;
  return (
    <section class="crew-code" aria-labelledby="crew-code-h">
      <h3 id="crew-code-h">Crew code</h3>
      {code ? (
        <>
          <p class="sub">Other phones join with this code: type it under “Join a crew” or scan it.</p>
          <p class="code" data-testid="crew-code">
            {formatCrewCode(code)}
          </p>
          <CrewQr text={joinUrl(code)} label={`QR code to join this study, code ${formatCrewCode(code)}`} />
        </>
      ) : (
        <p data-testid="crew-code">No code works now. Make a new code to let another phone join.</p>
      )}
      <div class="actions">
        <button
          type="button"
          class="btn"
          disabled={busy}
          onClick={() => run(() => newCode(id), 'A new code works now; the old one no longer does.')}
        >
          New code
        </button>
        {code && (
          <button
            type="button"
            class="btn"
            disabled={busy}
            onClick={() =>
              run(() => stopCode(id), 'The code is stopped: no phone can join until you make a new one.')
            }
          >
            Stop code
          </button>
        )}
        <button type="button" class="btn" disabled={busy} onClick={() => run(loadPhones)}>
          Show phones
        </button>
      </div>
      {phones && (
        <ul class="crew-phone-list" aria-label="Phones in the crew">
          {phones.map((p) => (
            <li key={p.phoneId}>
              {p.phoneId === you ? 'This phone' : `Phone ${p.device.slice(0, 8)}`}
              {p.creator ? ' (shared the study)' : ''}
              {p.revoked ? ' — removed' : ''}
              {!p.revoked && p.phoneId !== you && (
                <button
                  type="button"
                  class="btn"
                  disabled={busy}
                  onClick={() =>
                    run(async () => {
                      const r = await revokePhone(id, p.phoneId);
                      return r.ok ? loadPhones() : r;
                    }, 'Phone removed: it can no longer send or receive this study’s entries.')
                  }
                >
                  Remove {`phone ${p.device.slice(0, 8)}`}
                </button>
              )}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
