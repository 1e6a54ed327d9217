/**
 * Setup-form piece: declare strata as `name:weight` pairs (area share, hectares or number of units) and,
 * optionally, the effort of one entry in each (`name:minutes`), with the parse problem shown in words.
 * Parsing is the core's parseStrata, the same syntax as the command line's --strata / --cost.
 */
import type { StratumSetup } from '../core.ts';
import { parseStrata } from '../core.ts';

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

export function StrataFields(props: {
  value: StrataFieldsValue;
  onChange(v: StrataFieldsValue): void;
  problem?: string | undefined;
}) {
  const { value } = props;
  return (
    <fieldset class="strata-fields">
      <legend>Strata (optional)</legend>
      <label>
        Strata and weights, e.g. <code>woodland:0.6, meadow:0.4</code>
        <input
          type="text"
          name="strata"
          value={value.strata}
          aria-invalid={props.problem ? true : undefined}
          onInput={(e) => props.onChange({ ...value, strata: (e.currentTarget as HTMLInputElement).value })}
        />
      </label>
      <label>
        Effort per entry (optional), e.g. <code>woodland:5, meadow:2</code>
        <input
          type="text"
          name="strataCosts"
          value={value.costs}
          onInput={(e) => props.onChange({ ...value, costs: (e.currentTarget as HTMLInputElement).value })}
        />
      </label>
      {props.problem && (
        <p class="error" role="alert">
          {props.problem}
        </p>
      )}
      <p class="help">
        Weights are area shares or sizes; the estimate becomes the stratified mean and the field screen
        suggests where the next entry helps most.
      </p>
    </fieldset>
  );
}
