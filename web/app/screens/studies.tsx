/** The studies list: verdict and n per study, open, duplicate the setup, archive (never delete). */
import { useEffect, useState } from 'preact/hooks';
import type { Assessment } from '../../core.ts';
import { kindWords, syncLine, targetWords } from '../../core-light.ts';
import { loadCore } from '../../core-loader.ts';
import { device, persistState, settings, updateSettings } from '../../state/app-state.ts';
import { StudySession } from '../../state/session.ts';
import { useStore } from '../../state/store.ts';
import { exportedUpTo } from '../../storage/exports.ts';
import { ensurePersistence } from '../../storage/meta.ts';
import { listObservations } from '../../storage/observations.ts';
import type { StoredStudy } from '../../storage/schema.ts';
import { listStudies, setArchived } from '../../storage/studies.ts';
import { syncStatus } from '../../sync/status.ts';
import { TopBar } from '../components/chrome.tsx';
import { verdictClass } from '../components/verdict.tsx';
import { studySep } from '../number-style.ts';
import { href } from '../router.ts';
import { studiesSlots } from '../slots.ts';

interface Row {
  study: StoredStudy;
  a: Assessment | null;
  notExported: number;
  error?: string;
}

async function loadRows(): Promise<Row[]> {
  const [studiesRaw] = await Promise.all([listStudies(), loadCore()]);
  const studies = studiesRaw.reverse();
  return Promise.all(
    studies.map(async (study) => {
      try {
        const [records, upTo] = await Promise.all([listObservations(study.id), exportedUpTo(study.id)]);
        const s = new StudySession(study, records);
        return { study, a: s.assessment, notExported: s.lastSeq - upTo };
      } catch (err) {
        return { study, a: null, notExported: 0, error: (err as Error).message };
      }
    }),
  );
}

export function PersistNotice() {
  const p = useStore(persistState);
  if (!p) return null;
  if (p.answer === 'granted') {
    return (
      <p class="persist ok" data-testid="persist">
        Storage: kept on this phone (persistent storage granted).
      </p>
    );
  }
  return (
    <div class="persist warn" role="note" data-testid="persist">
      <p>
        <strong>Storage not guaranteed:</strong> the browser may clear the data when the phone runs short of
        space. Install the app (browser menu → Add to Home screen) before entering data, and export at the end
        of each day.
      </p>
      {p.answer === 'refused' && (
        <button
          type="button"
          class="btn"
          onClick={async () => persistState.set(await ensurePersistence(true))}
        >
          Ask again
        </button>
      )}
    </div>
  );
}

export function StudiesScreen({ archived }: { archived: boolean }) {
  const [rows, setRows] = useState<Row[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [tick, setTick] = useState(0);
  const s = useStore(settings);
  // each shared study's sync state (set by web/sync for linked studies only)
  const crew = useStore(syncStatus);
  useEffect(() => {
    loadRows()
      .then(setRows)
      .catch((err) => setError(`Could not read the studies: ${(err as Error).message}`));
  }, [tick]);
  const shown = rows?.filter((r) => !!r.study.archivedAt === archived) ?? [];
  const archivedCount = rows?.filter((r) => r.study.archivedAt).length ?? 0;
  const archive = async (r: Row, on: boolean) => {
    try {
      await setArchived(r.study.id, on);
      setTick((t) => t + 1);
    } catch (err) {
      setError((err as Error).message);
    }
  };
  return (
    <div class="screen studies-screen">
      <TopBar
        title={archived ? 'Archived studies' : 'Sure Enough'}
        {...(archived ? { back: { href: href.studies(), label: 'Studies' } } : {})}
      />
      {!archived && (
        <div class="actions-top">
          <a class="btn primary big" href={href.newStudy()}>
            New study
          </a>
          <a class="btn big" href={href.demo()}>
            Open the demo
          </a>
        </div>
      )}
      <PersistNotice />
      {error && (
        <p class="warn" role="alert">
          {error}
        </p>
      )}
      {rows === null && !error && <p class="loading">Loading…</p>}
      {rows !== null && shown.length === 0 && (
        <p class="sub">
          {archived ? 'No archived studies.' : 'No studies yet. Start one, or open the demo to try the app.'}
        </p>
      )}
      <ul class="cards" aria-label={archived ? 'Archived studies' : 'Studies'}>
        {shown.map((r) => (
          <li key={r.study.id} class="card" data-testid="study-card">
            <a class="card-main" href={href.field(r.study.id)}>
              <span class="card-name">{r.study.name}</span>
              <span class="card-kind">
                {kindWords(r.study.setup, studySep(r.study.setup))} ·{' '}
                {targetWords(r.study.setup.target, r.study.setup, studySep(r.study.setup))}
              </span>
              {r.a ? (
                <span class={`chip-verdict ${verdictClass(r.a)}`}>
                  {r.a.verdict.status} · n {r.a.n}
                </span>
              ) : (
                <span class="warn">{r.error}</span>
              )}
              {r.study.demo && <span class="tag">invented demo data</span>}
              {r.notExported > 0 && <span class="tag">{r.notExported} not yet exported</span>}
              {crew[r.study.id] && (
                <span class="tag" data-testid="study-sync">
                  Crew · {syncLine(crew[r.study.id]!)}
                </span>
              )}
            </a>
            <div class="card-actions">
              <a class="btn" href={href.newStudy(r.study.id, 'duplicate')}>
                Duplicate setup
              </a>
              {r.study.archivedAt ? (
                <button type="button" class="btn" onClick={() => archive(r, false)}>
                  Bring back
                </button>
              ) : (
                <button type="button" class="btn" onClick={() => archive(r, true)}>
                  Archive
                </button>
              )}
            </div>
          </li>
        ))}
      </ul>
      {!archived && archivedCount > 0 && (
        <a class="btn" href={href.studies(true)}>
          Archived studies ({archivedCount})
        </a>
      )}
      {studiesSlots.map((Slot, i) => (
        <Slot key={i} />
      ))}
      {!archived && (
        <section class="settings" aria-labelledby="settings-h">
          <h2 id="settings-h">Settings</h2>
          <Toggle label="Sun theme (high contrast)" on={s.sun} set={(v) => updateSettings({ sun: v })} />
          <Toggle
            label="Tone when the verdict changes"
            on={s.sound}
            set={(v) => updateSettings({ sound: v })}
          />
          <Toggle
            label="Vibrate when the verdict changes"
            on={s.vibrate}
            set={(v) => updateSettings({ vibrate: v })}
          />
          <Toggle
            label="Record position with entries"
            on={s.position}
            set={(v) => updateSettings({ position: v })}
          />
          <p class="sub">Device id: {device.get().slice(0, 8)}</p>
        </section>
      )}
    </div>
  );
}

function Toggle(props: { label: string; on: boolean; set(v: boolean): void }) {
  return (
    <label class="toggle">
      <input
        type="checkbox"
        checked={props.on}
        onChange={(e) => props.set((e.currentTarget as HTMLInputElement).checked)}
      />
      <span>{props.label}</span>
    </label>
  );
}
