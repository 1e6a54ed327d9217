/**
 * The estimate and its interval as a person reads them, the same on every surface: rounded to the
 * interval's precision (numbers.ts, `decimalsFor`), pass/fail as percentages of items, a one-sided bound as
 * "at most" / "at least", and near a limit with enough decimals that a bound just below it does not read as
 * equal to it.
 */
import type { StudySetup } from '../model/records.ts';
import type { Assessment } from '../model/types.ts';
import { decimalsFor, fixed, levelWords } from './numbers.ts';
import { figureScale, figureUnit, withUnit } from './study.ts';

export interface Shown {
  /** The estimate, or '—' when there is none. */
  estimate: string;
  /** "a to b", "at most b", "at least a", or null when there is no interval yet. */
  interval: string | null;
  unit: string;
}

/** Half-width of the reported interval or bound (distance from the estimate to the bound when one-sided). */
function shownHalfWidth(a: Assessment): number | null {
  if (a.estimate === null) return null;
  if (a.sided === 'upper') return a.upper === null ? null : a.upper - a.estimate;
  if (a.sided === 'lower') return a.lower === null ? null : a.estimate - a.lower;
  return a.lower === null || a.upper === null ? null : (a.upper - a.lower) / 2;
}

export function shownNumbers(a: Assessment, setup: StudySetup, sep = '.'): Shown {
  const pct = setup.kind === 'pass-fail';
  const k = figureScale(setup);
  const half = shownHalfWidth(a);
  let d = Math.max(decimalsFor(half === null ? null : half * k, pct ? 1 : 2), pct ? 1 : 0);
  const t = setup.target;
  if (t?.kind === 'limit') {
    for (const b of [a.lower, a.upper]) {
      if (b === null || !Number.isFinite(b)) continue;
      while (d < 6 && b !== t.value && fixed(b * k, d) === fixed(t.value * k, d)) d++;
    }
  }
  const unit = figureUnit(setup);
  if (a.estimate === null) return { estimate: '—', interval: null, unit };
  const f = (x: number) => fixed(x * k, d, sep);
  let interval: string | null = null;
  if (a.sided === 'upper' && a.upper !== null) interval = `at most ${f(a.upper)}`;
  else if (a.sided === 'lower' && a.lower !== null) interval = `at least ${f(a.lower)}`;
  else if (a.sided === 'two' && a.lower !== null && a.upper !== null)
    interval = `${f(a.lower)} to ${f(a.upper)}`;
  return { estimate: f(a.estimate), interval, unit };
}

/** The estimate with its unit: "9.279 mg/L", "12.5 % cracked weld", "3.40 per plot". */
export function estimateWords(a: Assessment, setup: StudySetup, sep = '.'): string {
  const s = shownNumbers(a, setup, sep);
  return a.estimate === null ? s.estimate : withUnit(s.estimate, s.unit);
}

/** The interval with its unit: "9.262 to 9.295 mg/L", "at most 31.0 % cracked weld", or "none yet". */
export function intervalWords(a: Assessment, setup: StudySetup, sep = '.'): string {
  const s = shownNumbers(a, setup, sep);
  return s.interval === null ? 'none yet' : withUnit(s.interval, s.unit);
}

/**
 * The interval method's label with its confidence levels read as levelWords does ("93.6 %" for a raised
 * level the core labels "93.5808 %").
 */
export function methodWords(a: Assessment, sep = '.'): string {
  return a.methodLabel.replace(/(\d+\.\d{2,}) %/g, (_, p: string) => levelWords(Number(p) / 100, sep));
}

/**
 * Why this interval: the data's own choice (details.methodChoice, src/assess/method-choice.ts) in one
 * sentence, the same on the screen and in the report; null when the study named its method.
 */
export function methodChoiceWords(a: Assessment): string | null {
  const c = a.details.methodChoice;
  if (typeof c !== 'object' || c === null) return null;
  return `Interval chosen from the data: ${c.reason}.`;
}

/**
 * The confidence the crew chose is the claim; when the stopping rule checks a wider interval (it looks after
 * every entry, and a rule that looks that often must check wider to keep its promise), say so and why.
 * Null when the interval shown is at the chosen level.
 */
export function checkedLevelWords(a: Assessment, setup: StudySetup, sep = '.'): string | null {
  if (Math.abs(a.level - setup.level) < 1e-9) return null;
  return `Your claim is ${levelWords(setup.level, sep)} confidence; the interval is checked at ${levelWords(a.level, sep)} because the data are looked at after every entry.`;
}
