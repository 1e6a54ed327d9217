/**
 * The field screen: the verdict on top, the entry pad at the bottom, both in view on every phone size
 * (web/styles/field-layout.css lays it out by the screen's height in text lines, so a larger text size
 * counts as a smaller screen). Between them a pane that scrolls: the backup and position line, the chart
 * (inline where there is room, a panel opened with one tap where there is not), the rule's known limits
 * and the design bar.
 */
import type { VNode } from 'preact';
import { useEffect, useState } from 'preact/hooks';
import type { Assessment, ObservationRecord, StudySetup } from '../../core.ts';
import {
  entryWords,
  figureScale,
  figureUnit,
  otherOutcomeWords,
  outcomeWords,
  valueUnit,
} from '../../core-light.ts';
import { coreIfLoaded, loadCore } from '../../core-loader.ts';
import { DesignBar, useDesignEntry } from '../../design/field-design.tsx';
import { settings, updateSettings } from '../../state/app-state.ts';
import { signalVerdictChange } from '../../state/feedback.ts';
import { currentFix, position, positionText, startPosition, stopPosition } from '../../state/position.ts';
import { useStore } from '../../state/store.ts';
import { type StudyView, useStudy } from '../../state/use-study.ts';
import type { NewEntry } from '../../storage/observations.ts';
import { Chart } from '../components/chart.tsx';
import { BackupLine, DemoLabel, StudyTabs, TopBar } from '../components/chrome.tsx';
import { CrewChip } from '../components/crew-chip.tsx';
import { CountPad, MeasurementPad, PassFailPad } from '../components/pads.tsx';
import { VerdictPanel } from '../components/verdict.tsx';
import { VoidDialog } from '../components/void-dialog.tsx';
import { studySep } from '../number-style.ts';
import { plausibilityQuestion } from '../plausible.ts';
import { href } from '../router.ts';
import { StudyGate } from './gate.tsx';

/** Default accuracy (metres) above which a saved position carries a warning. */
export const POSITION_WARN_M = 30;

export function afterWrite(before: Assessment, after: Assessment): void {
  if (before.verdict.status !== after.verdict.status) signalVerdictChange(after.verdict.status);
}

/** The warning for a position coarser than the study's setting, or undefined. */
export function positionWarning(accuracyM: number | undefined, setup: StudySetup): string | undefined {
  const limit = setup.positionWarnM ?? POSITION_WARN_M;
  if (accuracyM === undefined || !(accuracyM > limit)) return undefined;
  return `Position saved, but coarse: ± ${Math.round(accuracyM)} m is worse than ${limit} m. Wait for a better fix or note the place.`;
}

/**
 * Draws its content from the frame after its first: the chart is the largest drawing of the field screen
 * and the least needed at the moment it opens, so the verdict and the pad come first. Only this component
 * renders again then, not the screen.
 */
function AfterFirstFrame({ children }: { children: () => VNode }) {
  const [shown, setShown] = useState(false);
  useEffect(() => {
    const frame = requestAnimationFrame(() => setShown(true));
    return () => cancelAnimationFrame(frame);
  }, []);
  return shown ? children() : null;
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
  const setup = study.setup;
  const a = session.assessment;
  const sep = studySep(setup);
  const s = useStore(settings);
  const pos = useStore(position);
  const [undo, setUndo] = useState<ObservationRecord | null>(null);
  const [chartOpen, setChartOpen] = useState(false);
  const design = useDesignEntry(study, a);
  // the benchmark's known shortfalls for this setup (ruleWarnings): from the core, which may still be
  // loading when the screen first draws from the study's snapshot (they follow within the next frames)
  const [ruleCautions, setRuleCautions] = useState<string[]>(() => coreIfLoaded()?.ruleWarnings(setup) ?? []);
  useEffect(() => {
    let live = true;
    void loadCore().then((c) => {
      const next = c.ruleWarnings(setup);
      // unchanged (the core was loaded already): no second render of the screen
      if (live) setRuleCautions((prev) => (prev.join('\n') === next.join('\n') ? prev : next));
    });
    return () => {
      live = false;
    };
  }, [setup]);
  useEffect(() => {
    if (s.position) startPosition();
    return () => stopPosition();
  }, [s.position]);

  const save = async (entry: NewEntry) => {
    const fix = s.position ? currentFix() : undefined;
    const { record, before, applied } = await view.add(design.tag(fix ? { ...entry, position: fix } : entry));
    // the statistics follow the acknowledged save (after the next frame); signal a verdict change then
    void applied.then((after) => afterWrite(before, after)).catch(() => undefined);
    const warning = positionWarning(fix?.accuracyM, setup);
    return warning ? { seq: record.seq, warning } : { seq: record.seq };
  };
  /** The values that count so far (results, not reporting limits), for the outlier question. */
  const check = (x: number) => {
    // sorted and kept up to date by the session: the outlier question sorts nothing on the tap path
    const earlier = session.sortedValues();
    return plausibilityQuestion(x, setup, earlier, sep);
  };
  const padOff = !view.loaded || !!study.archivedAt;
  const kind = setup.kind;
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
  const coarse = pos.state === 'fix' && positionWarning(pos.pos.accuracyM, setup) !== undefined;
  return (
    <div class={`screen field-screen ${chartOpen ? 'chart-open' : ''}`}>
      <div class="field-head">
        <TopBar title={study.name} back={{ href: href.studies(), label: 'Studies' }} />
        <StudyTabs id={study.id} current="field" />
      </div>
      <div class="field-top" data-testid="field-pane">
        {study.archivedAt && (
          <p class="warn">This study is archived: bring it back from the list to add entries.</p>
        )}
        <VerdictPanel a={a} study={study} paceMs={session.pace.medianMs} sep={sep} />
        {study.demo && <DemoLabel />}
        <div class="status-row">
          <BackupLine notExported={session.lastSeq - view.exported} />
          <button
            type="button"
            class={`chip ${s.position ? 'on' : ''} ${coarse ? 'coarse' : ''}`}
            aria-pressed={s.position}
            onClick={() => updateSettings({ position: !s.position })}
          >
            {s.position ? positionText(pos) : positionText({ state: 'off' })}
          </button>
          <button
            type="button"
            class="chip chart-toggle"
            aria-expanded={chartOpen}
            aria-controls="field-chart"
            onClick={() => setChartOpen(!chartOpen)}
          >
            Chart
          </button>
          <CrewChip studyId={study.id} />
        </div>
        <div class="chart-panel" id="field-chart" data-testid="chart-panel">
          <div class="chart-panel-head">
            <h2>Running interval</h2>
            <button type="button" class="chip" onClick={() => setChartOpen(false)}>
              Close chart
            </button>
          </div>
          <AfterFirstFrame>
            {() => (
              <Chart
                series={session.series}
                current={a}
                target={setup.target}
                scale={figureScale(setup)}
                label={`Chart of ${study.name}`}
                unit={figureUnit(setup)}
                sep={sep}
              />
            )}
          </AfterFirstFrame>
        </div>
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
        <DesignBar
          design={design}
          study={study}
          assessment={a}
          records={session.records}
          isVoided={(rid) => session.isVoided(rid)}
        />
      </div>
      <div class="field-entry">
        {kind === 'measurement' && (
          <MeasurementPad
            disabled={padOff}
            onSave={save}
            check={check}
            sep={sep}
            undo={undoButton}
            unit={valueUnit(setup)}
            reportingLimit={setup.reportingLimit}
          />
        )}
        {kind === 'count' && <CountPad disabled={padOff} onSave={save} check={check} undo={undoButton} />}
        {kind === 'pass-fail' && (
          <PassFailPad
            disabled={padOff}
            onSave={save}
            undo={undoButton}
            outcome={outcomeWords(setup)}
            other={otherOutcomeWords(setup)}
          />
        )}
      </div>
      {undo && (
        <VoidDialog
          mode="undo"
          target={undo}
          kind={kind}
          outcome={outcomeWords(setup)}
          other={otherOutcomeWords(setup)}
          describe={(r) => entryWords(r, setup, sep)}
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
