/** The log: every event in order. Voided entries are struck through with the void's reason. */
import { useState } from 'preact/hooks';
import type { ObservationRecord } from '../../core.ts';
import { entryWords, otherOutcomeWords, outcomeWords } from '../../core-light.ts';
import { type StudyView, useStudy } from '../../state/use-study.ts';
import { DemoLabel, StudyTabs, TopBar } from '../components/chrome.tsx';
import { VoidDialog } from '../components/void-dialog.tsx';
import { dateTimeText, timeText } from '../format.ts';
import { studySep } from '../number-style.ts';
import { href } from '../router.ts';
import { afterWrite } from './field.tsx';
import { StudyGate } from './gate.tsx';

export function LogScreen({ id }: { id: string }) {
  const view = useStudy(id);
  return (
    <StudyGate view={view} screen="log">
      {() => <Log view={view} />}
    </StudyGate>
  );
}

function positionCell(r: ObservationRecord): string {
  const p = r.position;
  return p ? `${p.lat.toFixed(5)}, ${p.lon.toFixed(5)} ± ${Math.round(p.accuracyM)} m` : 'no fix';
}

function Log({ view }: { view: StudyView }) {
  const session = view.session!;
  const study = session.study;
  const sep = studySep(study.setup);
  const [edit, setEdit] = useState<{ mode: 'correct' | 'void'; target: ObservationRecord } | null>(null);
  const records = session.records;
  const seqOf = new Map(records.map((r) => [r.id, r.seq]));
  // a withdrawn entry names the entry that corrects it (the link runs both ways in the log)
  const correctedBy = new Map(
    records.filter((r) => r.corrects !== undefined).map((r) => [r.corrects, r.seq]),
  );
  return (
    <div class="screen log-screen">
      <TopBar title={study.name} back={{ href: href.studies(), label: 'Studies' }} />
      <StudyTabs id={study.id} current="log" />
      {study.demo && <DemoLabel />}
      <p class="sub">
        {records.length} records: {session.n} counted, {session.voidOf.size} voided. Nothing is ever deleted.
      </p>
      <ol class="log" aria-label="All entries in order">
        {[...records].reverse().map((r) => {
          const voidRec = session.voidOf.get(r.id);
          if (r.voids !== undefined) {
            return (
              <li key={r.id} class="log-item void-rec" data-testid="log-void">
                <span class="seq">#{r.seq}</span>
                <span class="what">
                  void of #{seqOf.get(r.voids) ?? '?'}: {r.reason}
                </span>
                <span class="meta">
                  <time dateTime={r.at}>{timeText(r.at)}</time>
                </span>
              </li>
            );
          }
          return (
            <li key={r.id} class={`log-item ${voidRec ? 'voided' : ''}`} data-testid="log-entry">
              <span class="seq">#{r.seq}</span>
              <span class="what">
                {voidRec ? <del>{entryWords(r, study.setup, sep)}</del> : entryWords(r, study.setup, sep)}
                {voidRec && <span class="reason"> voided: {voidRec.reason}</span>}
                {correctedBy.has(r.id) && (
                  <span class="corrects" data-testid="log-corrected-by">
                    {' '}
                    corrected by #{correctedBy.get(r.id)}
                  </span>
                )}
                {r.corrects !== undefined && (
                  <span class="corrects" data-testid="log-corrects">
                    {' '}
                    corrects #{seqOf.get(r.corrects) ?? '?'}
                  </span>
                )}
              </span>
              <span class="meta">
                <time dateTime={r.at} title={dateTimeText(r.at)}>
                  {timeText(r.at)}
                </time>{' '}
                · {positionCell(r)}
              </span>
              {r.note && <span class="note">Note: {r.note}</span>}
              {!voidRec && !study.archivedAt && (
                <span class="row-actions">
                  <button type="button" class="chip" onClick={() => setEdit({ mode: 'correct', target: r })}>
                    Correct #{r.seq}
                  </button>
                  <button type="button" class="chip" onClick={() => setEdit({ mode: 'void', target: r })}>
                    Void #{r.seq}
                  </button>
                </span>
              )}
            </li>
          );
        })}
      </ol>
      {records.length === 0 && <p class="sub">No entries yet.</p>}
      {edit && (
        <VoidDialog
          mode={edit.mode}
          target={edit.target}
          kind={study.setup.kind}
          outcome={outcomeWords(study.setup)}
          other={otherOutcomeWords(study.setup)}
          describe={(r) => entryWords(r, study.setup, sep)}
          onCancel={() => setEdit(null)}
          onVoid={async (reason) => {
            const { before } = await view.voidOne(edit.target.id, reason);
            afterWrite(before, session.assessment);
            setEdit(null);
          }}
          onCorrect={async (reason, entry) => {
            const { before } = await view.correct(edit.target.id, reason, entry);
            afterWrite(before, session.assessment);
            setEdit(null);
          }}
        />
      )}
    </div>
  );
}
