/** The field screen: verdict on top, the chart, the backup/position line, the entry pad at the bottom. */
import { useEffect, useMemo, useState } from 'preact/hooks';
import type { Assessment, ObservationRecord } from '../../core.ts';
import { entryWords, figureScale, outcomeWords, valueUnit } from '../../core-light.ts';
import { loadedCore } from '../../core-loader.ts';
import { DesignBar, useDesignEntry } from '../../design/field-design.tsx';
import { settings, updateSettings } from '../../state/app-state.ts';
import { signalVerdictChange } from '../../state/feedback.ts';
import { currentFix, position, positionText, startPosition, stopPosition } from '../../state/position.ts';
import { useStore } from '../../state/store.ts';
import { type StudyView, useStudy } from '../../state/use-study.ts';
import type { NewEntry } from '../../storage/observations.ts';
import { Chart } from '../components/chart.tsx';
import { BackupLine, DemoLabel, StudyTabs, TopBar } from '../components/chrome.tsx';
import { CountPad, MeasurementPad, PassFailPad } from '../components/pads.tsx';
import { VerdictPanel } from '../components/verdict.tsx';
import { VoidDialog } from '../components/void-dialog.tsx';
import { href } from '../router.ts';
import { StudyGate } from './gate.tsx';

export function afterWrite(before: Assessment, after: Assessment): void {
  if (before.verdict.status !== after.verdict.status) signalVerdictChange(after.verdict.status);
}

export function FieldScreen({ id }: { id: string }) {
  // opens from the study's running snapshot when it matches the log (web/state/use-study.ts)
  const view = useStudy(id, 'snapshot');
  return (
    <StudyGate view={view} screen="field">
      {() => <Field view={view} />}
    </StudyGate>
  );
}

function Field({ view }: { view: StudyView }) {
  const session = view.session!;
  const study = session.study;
  const a = session.assessment;
  const s = useStore(settings);
  const pos = useStore(position);
  const [undo, setUndo] = useState<ObservationRecord | null>(null);
  const design = useDesignEntry(study, a);
  // the benchmark's known shortfalls for this setup (ruleWarnings); the core is loaded before this screen
  const ruleCautions = useMemo(() => loadedCore().ruleWarnings(study.setup), [study.setup]);
  useEffect(() => {
    if (s.position) startPosition();
    return () => stopPosition();
  }, [s.position]);

  const save = async (entry: NewEntry): Promise<number> => {
    const fix = s.position ? currentFix() : undefined;
    const { record, before, applied } = await view.add(design.tag(fix ? { ...entry, position: fix } : entry));
    // the statistics follow the acknowledged save (after the next frame); signal a verdict change then
    void applied.then((after) => afterWrite(before, after)).catch(() => undefined);
    return record.seq;
  };
  const padOff = !view.loaded || !!study.archivedAt;
  const kind = study.setup.kind;
  const last = session.lastCounted();
  const undoButton = (
    <button
      type="button"
      class="key small undo"
      disabled={!last || padOff}
      onClick={() => setUndo(last ?? null)}
    >
      Undo last
    </button>
  );
  return (
    <div class="screen field-screen">
      <TopBar title={study.name} back={{ href: href.studies(), label: 'Studies' }} />
      <StudyTabs id={study.id} current="field" />
      <div class="field-top">
        {study.demo && <DemoLabel />}
        {study.archivedAt && (
          <p class="warn">This study is archived: bring it back from the list to add entries.</p>
        )}
        <VerdictPanel a={a} study={study} paceMs={session.pace.medianMs} />
        {ruleCautions.length > 0 && (
          <details class="rule-cautions" data-testid="field-rule-warnings">
            <summary>Known limits of this rule ({ruleCautions.length})</summary>
            <ul class="warnings">
              {ruleCautions.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          </details>
        )}
        <Chart
          series={session.series}
          current={a}
          target={study.setup.target}
          scale={figureScale(study.setup)}
          label={`Chart of ${study.name}`}
        />
        <DesignBar
          design={design}
          study={study}
          assessment={a}
          records={session.records}
          isVoided={(rid) => session.isVoided(rid)}
        />
      </div>
      <div class="status-row">
        <BackupLine notExported={session.lastSeq - view.exported} />
        <button
          type="button"
          class={`chip ${s.position ? 'on' : ''}`}
          aria-pressed={s.position}
          onClick={() => updateSettings({ position: !s.position })}
        >
          {s.position ? positionText(pos) : positionText({ state: 'off' })}
        </button>
      </div>
      {kind === 'measurement' && (
        <MeasurementPad
          disabled={padOff}
          onSave={save}
          undo={undoButton}
          unit={valueUnit(study.setup)}
          reportingLimit={study.setup.reportingLimit}
        />
      )}
      {kind === 'count' && <CountPad disabled={padOff} onSave={save} undo={undoButton} />}
      {kind === 'pass-fail' && (
        <PassFailPad disabled={padOff} onSave={save} undo={undoButton} outcome={outcomeWords(study.setup)} />
      )}
      {undo && (
        <VoidDialog
          mode="undo"
          target={undo}
          kind={kind}
          outcome={outcomeWords(study.setup)}
          describe={(r) => entryWords(r, study.setup)}
          onCancel={() => setUndo(null)}
          onVoid={async (reason) => {
            const { before } = await view.undoLast(reason);
            afterWrite(before, session.assessment);
            setUndo(null);
          }}
          onCorrect={async () => undefined}
        />
      )}
    </div>
  );
}
