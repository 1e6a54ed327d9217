/** The top of the field screen: verdict, n, estimate and interval with the method, and the "more" line. */
import type { Assessment } from '../../core.ts';
import { formatDuration } from '../../state/pace.ts';
import type { StoredStudy } from '../../storage/schema.ts';
import { shownNumbers } from '../format.ts';

export const SAFETY_LINE = 'Statistical guidance, not an instruction: stop if unsafe.';

export function moreText(a: Assessment, paceMs: number | null): string | null {
  const m = a.more;
  if (a.verdict.status !== 'keep going') return null;
  if (!m) return null;
  if (m.atLeast) return `at least ${m.likely} more before a verdict`;
  const range = m.low === m.high ? '' : ` (likely ${m.low}–${m.high})`;
  if (m.likely === 0)
    return `the next entries may settle it${range ? ` (likely ${m.low}–${m.high} more)` : ''}`;
  const pace = paceMs !== null ? `, about ${formatDuration(m.likely * paceMs)} at your pace` : '';
  return `about ${m.likely} more${range}${pace}`;
}

/** The method without the stopping rule's explanation (the report carries the whole label). */
export function shortMethod(label: string): string {
  return (label.split('; stopping rule')[0] ?? label).replace(/(\d+\.\d)\d+ %/g, '$1 %');
}

export function verdictClass(a: Assessment): string {
  return `v-${a.verdict.status.replace(' ', '-')}`;
}

export function VerdictPanel(props: { a: Assessment; study: StoredStudy; paceMs: number | null }) {
  const { a, study } = props;
  const s = shownNumbers(a, study);
  const more = moreText(a, props.paceMs);
  const decided = a.verdict.status !== 'keep going';
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
      {!(
        a.verdict.status === 'keep going' &&
        (a.verdict.reason === 'below-minimum' || a.verdict.reason === 'target-not-met') &&
        more
      ) && <p class="why">{a.verdict.message}</p>}
      <p class="est">
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
      <p class="method">
        {s.interval ? shortMethod(a.methodLabel) : 'no interval yet (needs at least 2 entries)'}
      </p>
      {more && (
        <p class="more" data-testid="more">
          {more}
        </p>
      )}
      {decided && (
        <p class="more done">
          {a.verdict.status === 'enough'
            ? 'The target is met at this confidence: you may stop.'
            : 'The decision is reached at this confidence: you may stop.'}
        </p>
      )}
      <p class="safety">{SAFETY_LINE}</p>
    </section>
  );
}
