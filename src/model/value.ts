/**
 * The one rule for a single entry's value, whatever surface it arrives through (the command line's input,
 * a bundle's events): what a measurement, a count or a pass/fail item may hold. Messages read after the
 * value ("2.5 is not a whole number…") or stand alone when they start otherwise.
 */
import type { DataKind } from './types.ts';

/**
 * Largest magnitude a value may have: the running moments square deviations (Welford 1962), and
 * (1e150)² = 1e300 stays below the largest double (≈ 1.8e308); a value of 1e155 would overflow to an
 * infinite spread. Field values are many orders of magnitude smaller; a larger one is a typing slip or a
 * unit that should be larger.
 */
export const MAX_VALUE_MAGNITUDE = 1e150;

/** Why a value cannot be an entry of this kind, or null when it can. */
export function valueProblem(value: number, kind: DataKind, censored = false): string | null {
  if (!Number.isFinite(value)) return 'is not a finite number';
  if (Math.abs(value) > MAX_VALUE_MAGNITUDE)
    return 'is beyond ±1e150, more than the statistics can square; write it in a larger unit';
  if (censored) {
    if (kind !== 'measurement')
      return 'a value below a reporting limit (<RL) is only allowed for measurements';
    if (!(value > 0)) return 'a reporting limit must be above zero';
    return null;
  }
  if (kind === 'pass-fail' && value !== 0 && value !== 1)
    return 'is not 0 or 1 (pass-fail: 1 = the counted outcome, 0 = the other)';
  if (kind === 'count') {
    if (value < 0) return 'is negative; counts are whole numbers ≥ 0';
    if (!Number.isInteger(value)) return 'is not a whole number; counts are whole numbers ≥ 0';
  }
  return null;
}
