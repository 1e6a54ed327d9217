/** The top of the field screen: verdict, n, estimate and interval with the method, and the "more" line. */
import type { Assessment } from '../../core.ts';
import { doneWords, methodWords, moreWords, shownNumbers } from '../../core-light.ts';
import { formatDuration } from '../../state/pace.ts';
import type { StoredStudy } from '../../storage/schema.ts';

export const SAFETY_LINE = 'Statistical guidance, not an instruction: stop if unsafe.';

/** The "more" line (src/words), with the time it takes at the crew's median pace when known. */
export function moreText(a: Assessment, paceMs: number | null): string | null {
  return moreWords(a, paceMs === null ? undefined : (entries) => formatDuration(entries * paceMs));
}

/** The method without the stopping rule's explanation (the report carries the whole label). */
export function shortMethod(a: Assessment): string {
  const label = methodWords(a);
  return label.split('; stopping rule')[0] ?? label;
}

export function verdictClass(a: Assessment): string {
  return `v-${a.verdict.status.replace(' ', '-')}`;
}

export function VerdictPanel(props: { a: Assessment; study: StoredStudy; paceMs: number | null }) {
  const { a, study } = props;
  const s = shownNumbers(a, study.setup);
  const done = doneWords(a);
  const more = moreText(a, props.paceMs);
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
      <p class="method">{s.interval ? shortMethod(a) : 'no interval yet (needs at least 2 entries)'}</p>
      {more && (
        <p class="more" data-testid="more">
          {more}
        </p>
      )}
      {done && <p class="more done">{done}</p>}
      <p class="safety">{SAFETY_LINE}</p>
    </section>
  );
}
