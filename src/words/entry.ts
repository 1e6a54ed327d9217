/** One entry of the log in words: the value exactly as stored (no rounding), with its unit. */
import type { ObservationRecord, StudySetup } from '../model/records.ts';
import { withSeparator } from './numbers.ts';
import { otherOutcomeWords, outcomeWords, valueUnit, withUnit } from './study.ts';

/** "12.4 mg/L", "< 0.5 mg/kg" (below the reporting limit), "3 per plot", "cracked weld", "no cracked weld" (or the crew's word for it), "void". */
export function entryWords(r: ObservationRecord, setup: StudySetup, sep = '.'): string {
  if (r.value === undefined) return 'void';
  if (setup.kind === 'pass-fail') return r.value ? outcomeWords(setup) : otherOutcomeWords(setup);
  return withUnit(`${r.censored ? '< ' : ''}${withSeparator(String(r.value), sep)}`, valueUnit(setup));
}
