/**
 * A study's setup in words: units, outcome, data kind, target, confidence level, sidedness and stopping
 * rule. Pass/fail figures are percentages of items everywhere (the core keeps proportions).
 */
import type { StudySetup } from '../model/records.ts';
import type { RuleName, Sided, Target } from '../model/types.ts';
import { levelWords, percent, plain } from './numbers.ts';

/** What a pass/fail study counts, in the crew's words ("cracked weld"); "outcome" when not named. */
export function outcomeWords(setup: StudySetup): string {
  return setup.outcomeName?.trim() || 'outcome';
}

/** The other result of a pass/fail item: the crew's own words ("latches"), else "no " + the outcome. */
export function otherOutcomeWords(setup: StudySetup): string {
  return setup.otherOutcomeName?.trim() || `no ${outcomeWords(setup)}`;
}

/** Unit of one entry: the measurement unit, "per plot" for counts, nothing for a pass/fail item. */
export function valueUnit(setup: StudySetup): string {
  if (setup.kind === 'measurement') return setup.unit ?? '';
  if (setup.kind === 'count') return 'per plot';
  return '';
}

/** Unit of the estimate and its interval: as an entry's, and percent of items for pass/fail. */
export function figureUnit(setup: StudySetup): string {
  return setup.kind === 'pass-fail' ? `% ${outcomeWords(setup)}` : valueUnit(setup);
}

/** Scale from the core's figures to the shown ones (pass/fail proportions are shown as percentages). */
export function figureScale(setup: StudySetup): number {
  return setup.kind === 'pass-fail' ? 100 : 1;
}

/** A number followed by a unit, with no dangling space when the unit is empty. */
export function withUnit(number: string, unit: string): string {
  return unit ? `${number} ${unit}` : number;
}

/** The data kind in words: "measurement in mg/kg", "count per plot (plot area 0.25 m2)", "pass/fail: cracked weld". */
export function kindWords(setup: StudySetup, sep = '.'): string {
  if (setup.kind === 'measurement') return `measurement${setup.unit ? ` in ${setup.unit}` : ''}`;
  if (setup.kind === 'count') {
    const area =
      setup.plotArea !== undefined
        ? ` (plot area ${withUnit(plain(setup.plotArea, sep), setup.plotAreaUnit ?? '')})`
        : '';
    return `count per plot${area}`;
  }
  return `pass/fail: ${outcomeWords(setup)}`;
}

/** The target in words; pass/fail margins in percentage points and limits in percent of items. */
export function targetWords(target: Target | undefined, setup: StudySetup, sep = '.'): string {
  if (!target) return 'no target (interval only)';
  const pf = setup.kind === 'pass-fail';
  switch (target.kind) {
    case 'margin':
      return pf
        ? `margin ± ${plain(target.value * 100, sep)} percentage points`
        : `margin ± ${withUnit(plain(target.value, sep), valueUnit(setup))}`;
    case 'relative':
      return `within ± ${percent(target.value, sep)} of the estimate`;
    case 'precision':
      return `precision SE/mean ≤ ${plain(target.value, sep)}`;
    case 'limit': {
      const v = pf
        ? `${plain(target.value * 100, sep)} % ${outcomeWords(setup)}`
        : withUnit(plain(target.value, sep), valueUnit(setup));
      const source = [target.source, target.date].filter(Boolean).join(', ');
      return `limit ${v}${source ? ` (${source})` : ''}`;
    }
  }
}

/** Sidedness in words. */
export function sidedWords(sided: Sided): string {
  return sided === 'two'
    ? 'two-sided interval'
    : sided === 'upper'
      ? 'one-sided upper bound'
      : 'one-sided lower bound';
}

/** Confidence level and sidedness: "95 %, two-sided interval". */
export function confidenceWords(level: number, sided: Sided, sep = '.'): string {
  return `${levelWords(level, sep)}, ${sidedWords(sided)}`;
}

/** The stopping rule by name, with what it promises. */
export function ruleWords(rule: RuleName): string {
  switch (rule) {
    case 'strict':
      return 'strict (valid however often you look)';
    case 'sprt':
      return 'limit decision (Wald SPRT)';
    case 'naive':
      return 'naive (comparison only)';
    case 'standard':
      return 'standard (guarded, coverage measured)';
  }
}

/** The stopping rule explained in a sentence's worth of words (the report's method paragraph). */
export function ruleExplained(rule: RuleName): string {
  switch (rule) {
    case 'standard':
      return 'the standard rule: after every entry the interval is checked against the target at a raised confidence level, calibrated by simulation so that looking after every entry does not lower the coverage below the stated level';
    case 'strict':
      return 'the strict rule: a plan that stays valid however often the interval is looked at';
    case 'sprt':
      return 'Wald’s sequential probability ratio test against the limit';
    case 'naive':
      return 'the naive rule (stop the first time the fixed-sample interval meets the target), which is known to under-cover';
  }
}
