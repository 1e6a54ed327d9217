/**
 * The crew's pooled verdict in the crew panel: the core's crew view (src/sync/crew-view.ts — the one
 * assessment over every phone's events in the pooled order), n per phone, and "where next" across the
 * crew's strata from the pooled assessment. Worded with the shared words module (src/words).
 */
import type { CrewView } from '../../core.ts';
import {
  crewCountWords,
  decisionWords,
  estimateWords,
  intervalWords,
  moreWords,
  phoneWords,
} from '../../core-light.ts';
import type { StoredStudy } from '../../storage/schema.ts';
import { studySep } from '../number-style.ts';

export function CrewVerdict(props: { view: CrewView; study: StoredStudy; ownDevice: string }) {
  const { view, study, ownDevice } = props;
  const setup = study.setup;
  const sep = studySep(setup);
  const a = view.assessment;
  const phones = view.phones.filter((p) => p.entries > 0);
  const next = a && typeof a.details.whereNext === 'string' ? a.details.whereNext : null;
  const why =
    a && typeof a.details.whereNextMessage === 'string'
      ? a.details.whereNextMessage.replace(/^Next in [^:]*: /, '')
      : null;
  const more = a ? moreWords(a) : null;
  return (
    <section class="crew-verdict" aria-labelledby="crew-verdict-h" data-testid="crew-view">
      <h3 id="crew-verdict-h">Crew verdict</h3>
      {a === null ? (
        <p data-testid="crew-verdict">No counted entries from the crew yet.</p>
      ) : (
        <>
          <p class="word">
            <strong data-testid="crew-verdict">{a.verdict.status}</strong> ·{' '}
            <span data-testid="crew-n">{crewCountWords(view.n, phones.length)}</span>
          </p>
          <p data-testid="crew-estimate">
            {estimateWords(a, setup, sep)} · interval {intervalWords(a, setup, sep)}
          </p>
          {more && <p>{more}</p>}
          <p class="sub">{decisionWords(a, setup, sep)}</p>
        </>
      )}
      {phones.length > 0 && (
        <ul class="crew-phones" aria-label="Entries per phone">
          {phones.map((p) => (
            <li key={p.device} data-testid="crew-phone">
              {phoneWords(p.device, ownDevice)}: {p.counted} counted
              {p.entries > p.counted ? ` (${p.entries - p.counted} withdrawn)` : ''}
            </li>
          ))}
        </ul>
      )}
      {next && (
        <p class="where-next" data-testid="crew-where-next">
          <strong>Where next for the crew: {next}</strong>
          {why && <span class="why"> — {why}</span>}
        </p>
      )}
      {view.strata.length > 0 && (
        <ul class="crew-strata" aria-label="Crew entries per stratum">
          {view.strata.map((r) => (
            <li key={r.name}>
              {r.name}: {r.n} {r.n === 1 ? 'entry' : 'entries'}
              {r.ready ? '' : ' (needs more for its spread)'}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
