/**
 * Setup-form piece: the strata typed as `name:weight` pairs (area share, hectares or number of units) and,
 * optionally, the effort of one entry in each (`name:minutes`), turned into the setup's strata or the
 * problem in words. The New study form shows the two fields (web/app/screens/new-study.tsx) and calls
 * this. Parsing is the core's parseStrata, the same syntax as the command line's --strata / --cost.
 */
import type { StratumSetup } from '../core.ts';
import { parseStrata } from '../core-light.ts';

export interface StrataFieldsValue {
  strata: string;
  costs: string;
}

/** The strata the two fields describe, undefined when empty, or the problem in words. */
export function strataFromFields(v: StrataFieldsValue): { strata?: StratumSetup[] } | { problem: string } {
  if (v.strata.trim() === '')
    return v.costs.trim() === '' ? {} : { problem: 'Effort per stratum needs strata.' };
  const r = parseStrata(v.strata, v.costs.trim() === '' ? undefined : v.costs);
  if (!r.ok) return { problem: `Strata: ${r.problem}.` };
  if (r.strata.length < 2) return { problem: 'Strata: declare at least two (or leave empty for none).' };
  return { strata: r.strata };
}
