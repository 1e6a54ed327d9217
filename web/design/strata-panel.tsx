/**
 * Field-screen piece for stratified studies: per-stratum progress (entries, whether the stratum has the two
 * entries its spread needs, share of the Neyman allocation) and the "where next" suggestion with its reason,
 * plus the stratum (and optional primary unit, e.g. a transect) the next entries are filed under.
 * All figures come from the core (strataProgress, the assessment's `whereNext*` details, neymanAllocation).
 */
import type { AnalysisSetup, Assessment, Point } from '../core.ts';
import { loadedCore } from '../core-loader.ts';

export interface StrataPanelProps {
  setup: AnalysisSetup;
  /** Entries that count (not voided), in entry order. */
  points: readonly Point[];
  assessment: Assessment;
  /** The stratum the next entries go into (null: none chosen yet). */
  current: string | null;
  onPick(name: string): void;
  /** Primary unit label (transect, room) for the next entries; '' for none. */
  unit: string;
  onUnit(label: string): void;
}

function pct(x: number): string {
  return `${Math.round(x * 100)} %`;
}

export function StrataPanel(props: StrataPanelProps) {
  const { setup, points, assessment: a } = props;
  // Mounted only on a loaded study's field screen, so the core is there.
  const { neymanAllocation, strataProgress } = loadedCore();
  const rows = strataProgress(points, setup);
  const next = typeof a.details.whereNext === 'string' ? a.details.whereNext : null;
  const why =
    typeof a.details.whereNextMessage === 'string'
      ? a.details.whereNextMessage.replace(/^Next in [^:]*: /, '')
      : null;
  const total = rows.reduce((s, r) => s + r.n, 0);
  let target: number[] | null = null;
  if (rows.every((r) => r.sd !== null) && rows.some((r) => (r.sd ?? 0) > 0) && total > 0) {
    const costs = setup.strata ?? [];
    target = neymanAllocation(
      rows.map((r, i) => {
        const c = costs[i]?.cost;
        return c === undefined
          ? { weight: r.weight, sd: r.sd ?? 0 }
          : { weight: r.weight, sd: r.sd ?? 0, cost: c };
      }),
      total,
    );
  }
  return (
    <section class="strata-panel" aria-label="Strata" data-testid="strata-panel">
      {next && (
        <p class="where-next" data-testid="where-next">
          <strong>Where next: {next}</strong>
          {why && <span class="why"> — {why}</span>}
        </p>
      )}
      <ul class="strata-list" style={{ listStyle: 'none', padding: 0, margin: '0.25rem 0' }}>
        {rows.map((r, i) => {
          const max = Math.max(2, Math.ceil(target?.[i] ?? 2), r.n);
          return (
            <li key={r.name} data-testid={`stratum-${r.name}`} class={r.name === next ? 'suggested' : ''}>
              <button
                type="button"
                class={`chip ${props.current === r.name ? 'on' : ''}`}
                aria-pressed={props.current === r.name}
                onClick={() => props.onPick(r.name)}
              >
                {r.name}
              </button>{' '}
              <progress max={max} value={r.n} aria-label={`${r.name}: ${r.n} entries`} />{' '}
              <span class="stratum-n" data-testid={`stratum-n-${r.name}`}>
                {r.n} {r.n === 1 ? 'entry' : 'entries'}
              </span>
              {!r.ready && (
                <span class="stratum-needs"> · needs {Math.max(0, 2 - (r.clusters || r.n))} more</span>
              )}
              <span class="stratum-weight"> · weight {pct(r.weight)}</span>
              {target && (
                <span class="stratum-target" title="Neyman allocation of the entries so far">
                  {' '}
                  · best share of {total} ≈ {target[i]!.toFixed(1)}
                </span>
              )}
            </li>
          );
        })}
      </ul>
      <label class="unit-label">
        Primary unit (transect, room) for the next entries{' '}
        <input
          type="text"
          value={props.unit}
          placeholder="none"
          onInput={(e) => props.onUnit((e.currentTarget as HTMLInputElement).value)}
        />
      </label>
      <p class="hint" data-testid="next-entry-stratum">
        Next entries go to <strong>{props.current ?? '—'}</strong>
        {props.unit.trim() !== '' ? ` · unit ${props.unit.trim()}` : ''}
      </p>
    </section>
  );
}
