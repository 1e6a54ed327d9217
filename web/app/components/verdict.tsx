/**
 * The top of the field screen. What a field worker reads at a glance comes first and stays in view on
 * every phone size: the verdict word and n, the estimate with its interval and unit, and the "more" line;
 * then the decision in plain words. How it was worked out (the method's published name, the rule's own
 * sentence with its lines and formulas) waits in a fold.
 */
import type { Assessment } from '../../core.ts';
import {
  checkedLevelWords,
  decisionWords,
  doneWords,
  methodChoiceWords,
  methodWords,
  moreWords,
  ruleWords,
  shownNumbers,
  unseenWords,
} from '../../core-light.ts';
import { formatDuration } from '../../state/pace.ts';
import type { StoredStudy } from '../../storage/schema.ts';
import type { Sep } from '../number-style.ts';

export const SAFETY_LINE = 'Statistical guidance, not an instruction: stop if unsafe.';

/** The "more" line (src/words), with the time it takes at the crew's median pace when known. */
export function moreText(a: Assessment, paceMs: number | null): string | null {
  return moreWords(a, paceMs === null ? undefined : (entries) => formatDuration(entries * paceMs));
}

/** The method without the stopping rule's explanation (the report carries the whole label). */
export function shortMethod(a: Assessment, sep: Sep = '.'): string {
  const label = methodWords(a, sep);
  return label.split('; stopping rule')[0] ?? label;
}

export function verdictClass(a: Assessment): string {
  return `v-${a.verdict.status.replace(' ', '-')}`;
}

export function VerdictPanel(props: { a: Assessment; study: StoredStudy; paceMs: number | null; sep: Sep }) {
  const { a, study, sep } = props;
  const s = shownNumbers(a, study.setup, sep);
  const done = doneWords(a, sep);
  const unseen = unseenWords(a, sep);
  const choice = methodChoiceWords(a);
  const more = moreText(a, props.paceMs);
  const decision = decisionWords(a, study.setup, sep);
  const checked = checkedLevelWords(a, study.setup, sep);
  const showWhy = !(a.verdict.status === 'keep going' && a.verdict.reason === 'below-minimum' && more);
  return (
    <section class={`verdict ${verdictClass(a)}`} aria-labelledby="verdict-word">
      <div class="verdict-top">
        <p class="word" id="verdict-word" data-testid="verdict" aria-live="polite">
          {a.verdict.status}
        </p>
        <p class="n">
          <span class="n-label">n</span> <span data-testid="n">{a.n}</span>
        </p>
      </div>
      <p class="est" data-testid="est-line">
        <span class="big" data-testid="estimate" data-value={a.estimate ?? undefined}>
          {s.estimate}
        </span>{' '}
        <span class="unit">{s.unit}</span>
        {s.interval && (
          <span class="ci">
            {' ('}
            <span data-testid="interval" data-lower={a.lower ?? undefined} data-upper={a.upper ?? undefined}>
              {s.interval}
            </span>
            )
          </span>
        )}
      </p>
      {more && (
        <p class="more" data-testid="more">
          {more}
        </p>
      )}
      {done && (
        <p class="more done" data-testid="done">
          {done}
        </p>
      )}
      {showWhy && (
        <p class="why" data-testid="decision">
          {decision}
        </p>
      )}
      <details class="how" data-testid="how">
        <summary>How this is worked out</summary>
        <p>
          {s.interval ? `Interval: ${shortMethod(a, sep)}.` : 'No interval yet (needs at least 2 entries).'}
        </p>
        {choice && <p data-testid="method-choice">{choice}</p>}
        {checked && <p data-testid="checked-level">{checked}</p>}
        {unseen && <p data-testid="unseen">{unseen}</p>}
        <p>
          Stopping rule: {ruleWords(study.setup.rule)}. {a.verdict.message}
        </p>
      </details>
      <p class="safety">{SAFETY_LINE}</p>
    </section>
  );
}
