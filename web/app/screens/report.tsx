/** The report: summary, the method in plain words, the chart, warnings, cautions, and the export slot. */
import {
  CAUTIONS,
  confidenceWords,
  decisionWords,
  estimateWords,
  figureScale,
  figureUnit,
  intervalWords,
  kindWords,
  levelWords,
  methodChoiceWords,
  methodWords,
  minimumWords,
  ruleWords,
  targetWords,
  unseenWords,
} from '../../core-light.ts';
import { loadedCore } from '../../core-loader.ts';
import { type StudyView, useStudy } from '../../state/use-study.ts';
import { Chart } from '../components/chart.tsx';
import { BackupLine, DemoLabel, StudyTabs, TopBar } from '../components/chrome.tsx';
import { dateTimeText } from '../format.ts';
import { studySep } from '../number-style.ts';
import { href } from '../router.ts';
import { reportSlots } from '../slots.ts';
import { StudyGate } from './gate.tsx';

export function ReportScreen({ id }: { id: string }) {
  const view = useStudy(id);
  return (
    <StudyGate view={view} screen="report">
      {() => <Report view={view} />}
    </StudyGate>
  );
}

function Report({ view }: { view: StudyView }) {
  const session = view.session!;
  const study = session.study;
  const a = session.assessment;
  const setup = study.setup;
  // the benchmark's known shortfalls for this setup, as on the field screen (the core is loaded with the study)
  const ruleLimits = loadedCore().ruleWarnings(setup);
  const t = setup.target;
  const sep = studySep(setup);
  const what =
    setup.kind === 'pass-fail'
      ? `the proportion of items with “${setup.outcomeName ?? 'the outcome'}”`
      : setup.kind === 'count'
        ? 'the mean count per plot'
        : 'the mean value';
  return (
    <div class="screen report-screen">
      <TopBar title={study.name} back={{ href: href.studies(), label: 'Studies' }} />
      <StudyTabs id={study.id} current="report" />
      {study.demo && <DemoLabel />}
      <section aria-labelledby="r-sum">
        <h2 id="r-sum">Summary</h2>
        <dl class="facts">
          <dt>Verdict</dt>
          <dd data-testid="report-verdict">{a.verdict.status}</dd>
          <dt>Entries counted</dt>
          <dd>
            {a.n} ({session.voidOf.size} voided, kept in the log)
          </dd>
          <dt>Estimate</dt>
          <dd data-testid="report-estimate">{estimateWords(a, setup, sep)}</dd>
          <dt>Interval</dt>
          <dd data-testid="report-interval">{intervalWords(a, setup, sep)}</dd>
          <dt>Data</dt>
          <dd>{kindWords(setup, sep)}</dd>
          <dt>Target</dt>
          <dd data-testid="report-target">{targetWords(t, setup, sep)}</dd>
          <dt>Confidence</dt>
          <dd data-testid="report-confidence">{confidenceWords(setup.level, setup.sided, sep)}</dd>
          <dt>Stopping rule</dt>
          <dd>{ruleWords(setup.rule)}</dd>
          {setup.population !== undefined && (
            <>
              <dt>Lot / population</dt>
              <dd>{setup.population}</dd>
            </>
          )}
          <dt>Setup</dt>
          <dd>
            version {study.version}, created {dateTimeText(study.createdAt)}
            {study.supersedes ? ' (replaces an earlier setup)' : ''}
          </dd>
        </dl>
        <BackupLine notExported={session.lastSeq - view.exported} />
        <a class="btn" href={href.newStudy(study.id, 'change')}>
          Change setup (starts version {study.version + 1}, linked)
        </a>
      </section>
      <section aria-labelledby="r-method">
        <h2 id="r-method">Method</h2>
        <p class="method-statement">
          After every entry the app recomputed {what} and its interval by {methodWords(a, sep)}, from the{' '}
          {a.n} entries that count (voided entries are left out). The target was {targetWords(t, setup, sep)},
          at {levelWords(setup.level, sep)} confidence, with the {ruleWords(setup.rule)} stopping rule; no
          verdict other than “keep going” is given before {minimumWords(a, setup, sep)} or while the data have
          no spread. {methodChoiceWords(a)} {unseenWords(a, sep)} Current verdict: {a.verdict.status} —{' '}
          {decisionWords(a, setup, sep)} ({a.verdict.message})
        </p>
        {a.warnings.length > 0 && (
          <ul class="warnings">
            {a.warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        )}
        {ruleLimits.length > 0 && (
          <>
            <h3>Known limits of this rule</h3>
            <ul class="warnings" data-testid="report-rule-limits">
              {ruleLimits.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          </>
        )}
      </section>
      <section aria-labelledby="r-chart">
        <h2 id="r-chart">Running interval</h2>
        <Chart
          series={session.series}
          current={a}
          target={t}
          scale={figureScale(setup)}
          label={`Chart of ${study.name}`}
          unit={figureUnit(setup)}
          sep={sep}
        />
      </section>
      <section aria-labelledby="r-cautions">
        <h2 id="r-cautions">Cautions</h2>
        <ul class="cautions">
          {CAUTIONS.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </section>
      <section aria-labelledby="r-export" class="export-slot" data-slot="report-exports">
        <h2 id="r-export">Hand over</h2>
        {reportSlots.length === 0 ? (
          <p class="sub">Exports are not part of this version yet. Keep the phone’s data until they are.</p>
        ) : (
          reportSlots.map((Slot, i) => (
            <Slot key={i} study={study} records={session.records} lastSeq={session.lastSeq} />
          ))
        )}
      </section>
    </div>
  );
}
