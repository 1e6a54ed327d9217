/**
 * Which interval suits the measurements so far, when the study leaves the choice to the data (method
 * `auto`, the default), as counts choose theirs by the dispersion test. Glue over one published criterion,
 * D'Agostino's skewness test (D'Agostino 1970; D'Agostino, Belanger & D'Agostino 1990,
 * src/stats/dagostino-skewness-test.ts), asked of the values and of their logarithms:
 *
 * 1. fewer than 8 values, or no spread: Student t — too few to judge the shape (the test is stated for n ≥ 8);
 * 2. the values not skewed to the right (z < 1.645, one-sided 5 %): Student t — the simplest claim holds
 *    until the data show skew;
 * 3. skewed to the right with some value zero or negative: the log-scale and gamma models do not apply —
 *    Johnson's modified t (Johnson 1978);
 * 4. skewed to the right, every value positive, and the logarithms skewed to the left (z of the logs
 *    ≤ −1.645): gamma-shaped data (the logarithm of a gamma variable is left-skewed, of a lognormal one
 *    symmetric) — the gamma-based interval (Grice & Bain 1980);
 * 5. skewed, logarithms skewed to the right too (z of the logs ≥ 1.645): heavier-tailed than lognormal, as a
 *    mixture with a small hot area is — neither model fits, and the log scale is the worst fit there (hot-spot
 *    mixtures 66–80 % against 73–91 % for this choice in the benchmark) — Johnson's modified t;
 * 6. otherwise (skewed, logarithms near-symmetric: lognormal-like) — the log-scale modified Cox interval.
 *
 * So a log-scale interval is chosen only for data whose logarithms do not lean left: on gamma-shaped data
 * the log-scale methods overestimate the mean and cover far less than they claim (gamma k = 0.5: 0–25 % in
 * test/bench/coverage.md). Chosen by measured coverage: the alternative of picking the lognormal or gamma
 * model with the larger maximized likelihood (the RML criterion, Dumonceaux & Antle 1973) covered lognormal
 * data at 88–94.6 % in the same benchmark (R = 1000 per cell), against 92–95.4 % for the test on the
 * logarithms, at the same coverage on gamma data, because a near tie sent lognormal data to the narrower
 * gamma interval. Every figure is O(1) from the running moments. The choice and its reason are reported as
 * `details.methodChoice`; an explicit method in the setup overrides it.
 */
import type { MethodChoice } from '../model/types.ts';
import { dagostinoSkewnessZ } from '../stats/dagostino-skewness-test.ts';
import type { RunningSummary } from '../stats/running-summary.ts';

/** One-sided 5 % point of the standard normal: D'Agostino's z beyond it is skew. */
const SKEW_Z = 1.6448536269514722;
const round4 = (x: number) => Math.round(x * 1e4) / 1e4;

export function chooseMeasurementMethod(s: RunningSummary): MethodChoice {
  const n = s.n;
  const skew = s.skewness;
  if (n < 8 || skew === null)
    return {
      method: 't',
      reason: 'fewer than 8 values with spread: too few to judge their shape, so Student t',
      criterion: { n },
    };
  const skewZ = dagostinoSkewnessZ(n, skew);
  const z = skewZ.toFixed(2);
  if (skewZ < SKEW_Z)
    return {
      method: 't',
      reason: `the values are not skewed to the right (D’Agostino z = ${z}, below 1.645): Student t`,
      criterion: { n, skewZ: round4(skewZ) },
    };
  if (s.positive < n)
    return {
      method: 'johnson-t',
      reason: `the values are skewed to the right (D’Agostino z = ${z}) and not all above zero: Student t moved for the skewness (Johnson 1978)`,
      criterion: { n, skewZ: round4(skewZ) },
    };
  const logSkew = s.logSkewness;
  const logZ = logSkew === null ? 0 : dagostinoSkewnessZ(n, logSkew);
  const criterion = { n, skewZ: round4(skewZ), logSkewZ: round4(logZ) };
  if (logZ <= -SKEW_Z)
    return {
      method: 'gamma',
      reason: `the values are skewed to the right (D’Agostino z = ${z}) and their logarithms to the left (z = ${logZ.toFixed(2)}), as gamma-shaped data are: the gamma-based interval`,
      criterion,
    };
  if (logZ >= SKEW_Z)
    return {
      method: 'johnson-t',
      reason: `the values are skewed to the right (D’Agostino z = ${z}) and so are their logarithms (z = ${logZ.toFixed(2)}): heavier-tailed than lognormal (a mixture, such as a hot area), so Student t moved for the skewness (Johnson 1978)`,
      criterion,
    };
  return {
    method: 'cox',
    reason: `the values are skewed to the right (D’Agostino z = ${z}) and their logarithms are not skewed to the left (z = ${logZ.toFixed(2)}), as lognormal data are: the log-scale (modified Cox) interval`,
    criterion,
  };
}
