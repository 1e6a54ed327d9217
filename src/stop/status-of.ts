/**
 * Verdict status from a target check — the one mapping every rule uses.
 *
 * Question answered: "which of the four verdicts does this target check mean?" (met → enough,
 * below → below limit, above → above limit, anything else → keep going). Source: the verdict vocabulary of
 * src/model/types.ts (src/cli/README.md, "Output": `keep going`, `enough`, `below limit`, `above limit`).
 *
 * @example statusOf('met') // 'enough'
 */
import type { VerdictStatus } from '../model/types.ts';
import type { TargetCheck } from './rule-context.ts';

export function statusOf(check: TargetCheck): VerdictStatus {
  switch (check) {
    case 'met':
      return 'enough';
    case 'below':
      return 'below limit';
    case 'above':
      return 'above limit';
    default:
      return 'keep going';
  }
}
