/**
 * How a study writes numbers: one decimal separator on every screen of the study. A study created on
 * this version stores its separator (setup `decimalSeparator`, chosen in the New study form and defaulting
 * to the phone's locale); an older study without one follows the phone's locale.
 */
import type { StudySetup } from '../core.ts';

export type Sep = '.' | ',';

/** The decimal separator of a locale (BCP 47 tag) by Intl.NumberFormat's own parts; '.' when unknown. */
export function localeSeparator(lang?: string): Sep {
  try {
    const tag = lang ?? (typeof navigator === 'undefined' ? 'en' : navigator.language);
    const part = new Intl.NumberFormat(tag).formatToParts(1.5).find((p) => p.type === 'decimal');
    return part?.value === ',' ? ',' : '.';
  } catch {
    return '.';
  }
}

/** The study's separator: its own setting, else the phone's locale. */
export function studySep(setup: StudySetup): Sep {
  return setup.decimalSeparator ?? localeSeparator();
}

/** The pad's decimal key in words, for screen readers and tests. */
export function sepName(sep: Sep): string {
  return sep === ',' ? 'Decimal comma' : 'Decimal point';
}
