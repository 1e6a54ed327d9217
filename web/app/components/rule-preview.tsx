/**
 * What the chosen stopping rule will cost and promise, shown live in the setup form (issue 4): for the
 * limit decision (SPRT) the operating characteristic — the chance of "below limit" at several true values —
 * and the expected number of observations (Wald's ASN) at the edges of the indifference zone and at the
 * limit, with the truncation maximum; for strict, the expected extra observations over a fixed-size plan;
 * for every rule, the warnings for regimes where the coverage benchmark found it short.
 *
 * All figures come from the core (src/stop: sprtModelOf, sprtOperatingCharacteristic, sprtMaxN,
 * strictCost, ruleWarnings), passed in as `core` once `loadCore()` has resolved — web/ computes nothing.
 */
import type { StudySetup } from '../../core.ts';

type Core = typeof import('../../core.ts');
type SprtModel = import('../../core.ts').SprtModel;

/** σ of ln x for a coefficient of variation: √ln(1 + CV²) (lognormal). */
function logSigma(cv: number): number {
  return Math.sqrt(Math.log1p(cv * cv));
}

export interface SprtRow {
  theta: number;
  /** What this value is: lower edge, limit, upper edge, or blank. */
  role: string;
  below: number;
  asn: number;
}

export interface SprtPreview {
  rows: SprtRow[];
  maxN: number;
  model: SprtModel;
}

/**
 * The SPRT's model for the setup screen. Pass/fail and counts need nothing more; measurements (log scale)
 * need the spread, which is unknown before the pilot: a planning CV stands in for it.
 */
export function sprtPreview(core: Core, setup: StudySetup, planningCv: number): SprtPreview | null {
  const s = setup.sprt;
  if (setup.rule !== 'sprt' || !s || setup.target?.kind !== 'limit') return null;
  let model: SprtModel | null;
  if (setup.kind === 'measurement') {
    if (!(planningCv > 0) || !(s.lowerBound > 0)) return null;
    const sigma = logSigma(planningCv);
    model = {
      family: 'lognormal',
      sigma,
      sigmaForSpacing: sigma,
      theta0: s.lowerBound,
      theta1: s.upperBound,
      alpha: s.alpha,
      beta: s.beta,
    };
  } else model = core.sprtModelOf(setup, []);
  if (model === null) return null;
  const maxN = core.sprtMaxN(setup, model);
  const limit = setup.target.value;
  const t0 = s.lowerBound;
  const t1 = s.upperBound;
  const step = (t1 - t0) / 2;
  const points: [number, string][] = [
    [t0 - step, ''],
    [t0, 'acceptable value'],
    [limit, 'limit'],
    [t1, 'value to catch'],
    [t1 + step, ''],
    [t1 + 2 * step, ''],
  ];
  const rows: SprtRow[] = [];
  for (const [theta, role] of points) {
    if (!(theta > 0) || (setup.kind === 'pass-fail' && !(theta < 1))) continue;
    const oc = core.sprtOperatingCharacteristic(model, theta, maxN);
    rows.push({ theta, role, below: oc.acceptProbability, asn: oc.asn });
  }
  return { rows, maxN, model };
}

export interface StrictPreview {
  factor: number;
  reference: number;
  expectedTotal: number;
  basis: string;
}

/** Strict's expected total against a fixed-size plan (Stein's ratio; pass/fail: the confidence sequence). */
export function strictPreview(core: Core, setup: StudySetup): StrictPreview | null {
  if (setup.rule !== 'strict' || !setup.target) return null;
  const t = setup.target;
  if (setup.kind !== 'pass-fail') {
    if (t.kind === 'limit') return null;
    const reference = 100;
    const c = core.strictCost(setup, reference);
    return {
      factor: c.factor,
      reference,
      expectedTotal: c.expectedTotal,
      basis: `Stein’s two-stage plan with a pilot of ${Math.max(2, core.minimumBeforeVerdict(setup))}: for every 100 observations a fixed-size plan would need`,
    };
  }
  const guess = t.kind === 'limit' ? t.value / 2 : 0.5;
  if (!(guess > 0 && guess < 1)) return null;
  const q = setup.sided === 'two' && t.kind !== 'limit' ? 1 - (1 - setup.level) / 2 : setup.level;
  const z = core.normalQuantile(q);
  const d =
    t.kind === 'limit' ? Math.abs(t.value - guess) : t.kind === 'relative' ? t.value * guess : t.value;
  if (!(d > 0)) return null;
  const reference = Math.ceil(
    core.proportionSampleSize({
      p: guess,
      target: t.kind === 'limit' ? 'margin' : t.kind,
      value: t.kind === 'limit' ? d : t.value,
      z,
    }),
  );
  const c = core.strictCost(setup, reference, guess);
  return {
    factor: c.factor,
    reference,
    expectedTotal: c.expectedTotal,
    basis:
      t.kind === 'limit'
        ? `if the true rate is half the limit (${pctText(guess)}): a fixed-size plan needs`
        : `at a rate of 50 % (the widest case): a fixed-size plan needs`,
  };
}

function pctText(x: number): string {
  return `${Number((x * 100).toPrecision(3))} %`;
}

/** A true value as the form shows it (percent for pass/fail). */
export function thetaText(theta: number, kind: StudySetup['kind'], unit: string): string {
  if (kind === 'pass-fail') return pctText(theta);
  return `${Number(theta.toPrecision(3))}${unit ? ` ${unit}` : ''}`;
}

/** ASN as shown: one decimal below 100, whole numbers above. */
export function asnText(asn: number): string {
  return asn < 100 ? asn.toFixed(1) : String(Math.round(asn));
}

/** P(below) as shown: whole percent, with < 1 % and > 99 % at the ends. */
export function probabilityText(p: number): string {
  if (p < 0.01) return '< 1 %';
  if (p > 0.99) return '> 99 %';
  return `${Math.round(p * 100)} %`;
}

export function RulePreview(props: {
  core: Core | null;
  setup: StudySetup | null;
  planningCv: number;
  unit: string;
}) {
  const { core, setup } = props;
  if (core === null)
    return (
      <section class="rule-preview" aria-label="What this rule costs">
        <p class="help">Loading the figures for this rule…</p>
      </section>
    );
  if (setup === null)
    return (
      <section class="rule-preview" aria-label="What this rule costs">
        <p class="help">
          Fill in the target (and, for a limit decision, the zone) to see what this rule costs.
        </p>
      </section>
    );
  let sprt: SprtPreview | null = null;
  let strict: StrictPreview | null = null;
  let problem: string | null = null;
  try {
    sprt = sprtPreview(core, setup, props.planningCv);
    strict = strictPreview(core, setup);
  } catch (err) {
    problem = (err as Error).message;
  }
  const warnings = core.ruleWarnings(setup);
  return (
    <section class="rule-preview" aria-label="What this rule costs" data-testid="rule-preview">
      <h3>What this rule costs</h3>
      {problem && <p class="field-error">These settings cannot be used: {problem}</p>}
      {sprt && (
        <div data-testid="sprt-preview">
          <p class="help">
            If the true {setup.kind === 'pass-fail' ? 'rate' : 'mean'} is … the chance the test says “below
            limit”, and the expected number of observations until it decides:
          </p>
          <table class="oc-table">
            <thead>
              <tr>
                <th scope="col">true value</th>
                <th scope="col">says “below”</th>
                <th scope="col">expected n</th>
              </tr>
            </thead>
            <tbody>
              {sprt.rows.map((r) => (
                <tr
                  key={r.theta}
                  class={r.role ? 'key-row' : undefined}
                  data-theta={r.theta}
                  data-below={r.below}
                  data-asn={r.asn}
                >
                  <td>
                    {thetaText(r.theta, setup.kind, props.unit)}
                    {r.role && <span class="role"> {r.role}</span>}
                  </td>
                  <td>{probabilityText(r.below)}</td>
                  <td>{asnText(r.asn)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p class="help" data-testid="sprt-max" data-max={sprt.maxN}>
            At most {sprt.maxN} observations: if neither line is reached by then, the middle line decides
            (weaker evidence).
            {setup.kind === 'measurement' &&
              ' Figures for measurements assume the spread entered below; the field screen uses the spread of your values.'}
          </p>
        </div>
      )}
      {strict && (
        <p class="help" data-testid="strict-preview" data-factor={strict.factor}>
          Strict costs about {Math.round((strict.factor - 1) * 100)} % more observations than a fixed-size
          plan — {strict.basis} {strict.reference}, strict expects about {Math.ceil(strict.expectedTotal)}.
        </p>
      )}
      {!sprt && !strict && !problem && setup.rule === 'standard' && (
        <p class="help">
          Standard: checks after every entry at a slightly higher confidence, so the stopped interval keeps
          its promise; it costs a few more observations than a fixed plan (up to about 1.25×).
        </p>
      )}
      {warnings.length > 0 && (
        <ul class="warnings" data-testid="rule-warnings">
          {warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      )}
    </section>
  );
}
