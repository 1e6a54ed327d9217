/**
 * The New study form's further sections: the interval method of measurements (chosen from the data unless
 * the crew names one), Iwao's coefficients for counts (the advice names them beside
 * Taylor's), what the exports need (for counts the scientific name and how the plots were counted, which
 * Darwin Core requires), the other pass/fail result in the crew's words, how numbers are written, and the
 * plausibility settings (expected range, position accuracy).
 */
import type { ComponentChildren } from 'preact';
import { localeSeparator } from '../number-style.ts';
import { COUNT_RANGE } from '../plausible.ts';
import type { Errors, Form } from './new-study-form.ts';

type TextField = (
  k: keyof Form,
  label: string,
  o?: { mode?: 'decimal' | 'numeric' | 'text'; help?: ComponentChildren; suffix?: string },
) => ComponentChildren;

interface Props {
  f: Form;
  set<K extends keyof Form>(k: K, v: Form[K]): void;
  text: TextField;
  errors: Errors;
}

function Choice<K extends 'method' | 'sep'>(props: {
  f: Form;
  k: K;
  legend: string;
  options: [Form[K], string, string][];
  set(k: K, v: Form[K]): void;
  error?: string | undefined;
}) {
  return (
    <fieldset class={`choices ${props.error ? 'invalid' : ''}`}>
      <legend>{props.legend}</legend>
      {props.options.map(([v, label, help]) => (
        <label key={String(v)} class="choice">
          <input
            type="radio"
            name={props.k}
            checked={props.f[props.k] === v}
            onChange={() => props.set(props.k, v)}
          />
          <span>
            <strong>{label}</strong>
            {help && <span class="help">{help}</span>}
          </span>
        </label>
      ))}
      {props.error && <p class="field-error">{props.error}</p>}
    </fieldset>
  );
}

/** Right after the data kind: the method of measurements; for counts and pass/fail, their own words. */
export function KindExtras({ f, set, text, errors }: Props) {
  if (f.kind === 'measurement')
    return (
      <Choice
        f={f}
        k="method"
        legend="How the interval is computed"
        set={set}
        error={errors.method}
        options={[
          [
            '',
            'Chosen from the data (recommended)',
            'The app picks the interval that fits the values so far — Student t, a skewness-adjusted t, gamma-based or log scale — and says which and why.',
          ],
          ['t', 'Ordinary mean (Student t)', 'For values that spread evenly around the mean.'],
          [
            'gamma',
            'Gamma-based, for skewed values',
            'Skewed values whose logarithms are skewed too (gamma-shaped). Values must be above zero.',
          ],
          [
            'cox',
            'Log scale, for lognormal values (modified Cox)',
            'Most values small, a few large, with logarithms that spread evenly. Values must be above zero.',
          ],
        ]}
      />
    );
  if (f.kind === 'count')
    return (
      <>
        {text('taxon', 'Scientific name (for Darwin Core)', {
          help: 'The counted taxon, e.g. “Quercus robur”. The Darwin Core export needs it.',
        })}
        {text('samplingProtocol', 'How it was counted (optional)', {
          help: 'e.g. “1 m² quadrats, all seedlings under 50 cm”. Goes with the export.',
        })}
      </>
    );
  return text('otherOutcome', 'The other result (optional)', {
    help: `What an item without the outcome is called, e.g. “latches”. Left empty: “no ${f.outcome.trim() || 'outcome'}”.`,
  });
}

/** Iwao's patchiness regression, beside Taylor's power law in the counts' planning fold. */
export function IwaoFields({ text }: Pick<Props, 'text'>) {
  return (
    <>
      {text('iwaoAlpha', 'Iwao’s regression α', { mode: 'decimal' })}
      {text('iwaoBeta', 'Iwao’s regression β', {
        mode: 'decimal',
        help: 'Mean crowding = α + β · mean, from earlier surveys. With a precision target it lets the standard rule stop on a fixed-precision line.',
      })}
    </>
  );
}

/** How numbers are written, and the values and positions to question. */
export function NumberExtras({ f, set, text, errors }: Props) {
  const phone = localeSeparator();
  const unit = f.kind === 'measurement' ? f.unit : f.kind === 'count' ? 'per plot' : '';
  const dflt =
    f.kind === 'count'
      ? `Left empty: ${COUNT_RANGE.low} to ${COUNT_RANGE.high.toLocaleString('en').replace(',', ' ')} per plot.`
      : f.unit.trim() === '%'
        ? 'Left empty: 0 to 100 %.'
        : 'Left empty: no range, only values far from the others are questioned.';
  return (
    <>
      <Choice
        f={f}
        k="sep"
        legend="Decimal separator for this study"
        set={set}
        error={errors.sep}
        options={[
          ['', `As this phone writes numbers (${phone === ',' ? 'comma: 6,5' : 'point: 6.5'})`, ''],
          ['.', 'Point: 6.5', ''],
          [',', 'Comma: 6,5', ''],
        ]}
      />
      {f.kind !== 'pass-fail' && (
        <fieldset class="choices">
          <legend>Values you expect (optional)</legend>
          <p class="help">
            A value outside is questioned before it is saved (“keep it?”), never refused. {dflt}
          </p>
          {text('rangeLow', 'Expected lowest value', { mode: 'decimal', suffix: unit })}
          {text('rangeHigh', 'Expected highest value', { mode: 'decimal', suffix: unit })}
        </fieldset>
      )}
      {text('positionWarnM', 'Warn when the position is worse than', {
        mode: 'decimal',
        suffix: 'm',
        help: 'An entry with a coarser GPS fix is saved with a visible warning.',
      })}
    </>
  );
}
