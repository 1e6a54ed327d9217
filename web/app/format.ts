/** Display formatting only (rounding for reading); the numbers themselves come from the core. */
import type { Assessment, Target } from '../core.ts';
import type { StoredStudy } from '../storage/schema.ts';

/** Decimals so that the interval's half-width shows two significant digits (0–6 decimals). */
export function decimalsFor(halfWidth: number | null, fallback = 2): number {
  if (halfWidth === null || !(halfWidth > 0) || !Number.isFinite(halfWidth)) return fallback;
  return Math.min(6, Math.max(0, 1 - Math.floor(Math.log10(halfWidth))));
}

export function fmt(x: number, decimals: number): string {
  return x.toFixed(decimals);
}

export function unitOf(study: StoredStudy): string {
  const s = study.setup;
  if (s.kind === 'measurement') return s.unit ?? '';
  if (s.kind === 'count') return 'per plot';
  return '';
}

export function outcomeOf(study: StoredStudy): string {
  return study.setup.outcomeName?.trim() || 'outcome';
}

export interface Shown {
  estimate: string;
  interval: string | null;
  unit: string;
}

/** Estimate and interval as shown: pass/fail as a percentage of items, others in the study's unit. */
export function shownNumbers(a: Assessment, study: StoredStudy): Shown {
  const pct = study.setup.kind === 'pass-fail';
  const k = pct ? 100 : 1;
  const half = a.lower !== null && a.upper !== null ? ((a.upper - a.lower) * k) / 2 : null;
  let d = Math.max(decimalsFor(half, pct ? 1 : 2), pct ? 1 : 0);
  // Near a limit, show enough decimals that a bound just below it does not read as equal to it.
  const t = study.setup.target;
  if (t?.kind === 'limit') {
    for (const b of [a.lower, a.upper]) {
      if (b === null || !Number.isFinite(b)) continue;
      while (d < 6 && b !== t.value && fmt(b * k, d) === fmt(t.value * k, d)) d++;
    }
  }
  const unit = pct ? `% ${outcomeOf(study)}` : unitOf(study);
  if (a.estimate === null) return { estimate: '—', interval: null, unit };
  const est = fmt(a.estimate * k, d);
  let interval: string | null = null;
  if (a.lower !== null && a.upper !== null) {
    const lo = Number.isFinite(a.lower) ? fmt(a.lower * k, d) : '−∞';
    const hi = Number.isFinite(a.upper) ? fmt(a.upper * k, d) : '∞';
    interval = `${lo} to ${hi}`;
  }
  return { estimate: est, interval, unit };
}

export function levelText(level: number): string {
  return `${Number((level * 100).toFixed(2))} %`;
}

export function targetText(t: Target | undefined, study: StoredStudy): string {
  if (!t) return 'no target';
  const s = study.setup;
  const unit = s.kind === 'pass-fail' ? '' : ` ${unitOf(study)}`;
  switch (t.kind) {
    case 'margin':
      return s.kind === 'pass-fail'
        ? `margin ± ${Number((t.value * 100).toFixed(4))} percentage points`
        : `margin ± ${t.value}${unit}`;
    case 'relative':
      return `within ± ${Number((t.value * 100).toFixed(4))} % of the estimate`;
    case 'precision':
      return `precision SE/mean ≤ ${t.value}`;
    case 'limit': {
      const v =
        s.kind === 'pass-fail'
          ? `${Number((t.value * 100).toFixed(4))} % ${outcomeOf(study)}`
          : `${t.value}${unit}`;
      const src = [t.source, t.date].filter(Boolean).join(', ');
      return `limit ${v}${src ? ` (${src})` : ''}`;
    }
  }
}

export function kindText(study: StoredStudy): string {
  const s = study.setup;
  if (s.kind === 'measurement') return `measurement${s.unit ? ` in ${s.unit}` : ''}`;
  if (s.kind === 'count')
    return `count per plot${s.plotArea ? ` of ${s.plotArea} ${s.plotAreaUnit ?? ''}`.trimEnd() : ''}`;
  return `pass/fail: ${outcomeOf(study)}`;
}

export function ruleText(rule: string): string {
  return rule === 'strict'
    ? 'strict (valid however often you look)'
    : rule === 'sprt'
      ? 'limit decision (Wald SPRT)'
      : rule === 'naive'
        ? 'naive (comparison only)'
        : 'standard (guarded, coverage measured)';
}

export function timeText(iso: string): string {
  const m = /T(\d\d:\d\d:\d\d)/.exec(iso);
  return m ? (m[1] as string) : iso;
}
export function dateTimeText(iso: string): string {
  return iso.replace('T', ' ').replace(/\.\d+/, '');
}
