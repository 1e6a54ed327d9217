/**
 * Measurements (a number with a unit): by default the interval the data choose (method-choice.ts: Student t,
 * Johnson's modified t, the gamma-based interval or the modified Cox interval), or the method the study names
 * (those, Land or Chebyshev). Glue over the method files; see each for its source.
 */
import type { AnalysisSetup, MeasurementMethod, MethodChoice, Sided, Target } from '../../model/types.ts';
import { adjustedExcessKurtosis, boxVarianceDf } from '../../plan/box-variance-df.ts';
import { sigmaQuantile as sigmaQ } from '../../plan/chi-square-sigma-limits.ts';
import { tQuantileAtRealDf } from '../../plan/fixed-point-sample-size.ts';
import { projectLimitDecision } from '../../plan/limit-decision-projection.ts';
import { logScaleRelativeSampleSize } from '../../plan/log-scale-relative-sample-size.ts';
import { projectMeasurement } from '../../plan/measurement-projection.ts';
import { chebyshevBound } from '../../stats/chebyshev-bound.ts';
import { gammaMeanInterval } from '../../stats/gamma-mean-interval.ts';
import { johnsonTInterval } from '../../stats/johnson-t-interval.ts';
import { landInterval } from '../../stats/land-interval.ts';
import { modifiedCoxInterval } from '../../stats/modified-cox-interval.ts';
import type { RunningSummary } from '../../stats/running-summary.ts';
import { studentTInterval } from '../../stats/student-t-interval.ts';
import type { Details, Estimator, Projection } from '../estimator.ts';
import { oneValueGuard, quantileProbability, sidedWords } from '../estimator.ts';
import { chooseMeasurementMethod } from '../method-choice.ts';

const LABELS: Record<MeasurementMethod, string> = {
  auto: 'chosen from the data',
  t: 'Student t',
  'johnson-t': 'Johnson’s modified t (skewness-adjusted)',
  gamma: 'gamma-based (Grice & Bain 1980)',
  cox: 'modified Cox (Olsson 2005, log scale, t quantile)',
  land: "Land's exact method (log scale)",
  chebyshev: 'Chebyshev (mean and SD)',
};

export function measurementEstimator(summary: RunningSummary, setup: AnalysisSetup): Estimator {
  const n = summary.n;
  const mean = summary.mean;
  const sd = summary.sd;
  const population = setup.population;
  const requested = (setup.method ?? 'auto') as MeasurementMethod;
  const warnings: string[] = [];
  // the data's own choice; with a method named in the setup it is still worked out (O(1)) so that a named
  // log-scale method on gamma-shaped data can be warned about
  const choice: MethodChoice = chooseMeasurementMethod(summary);
  let method = (requested === 'auto' ? choice.method : requested) as Exclude<MeasurementMethod, 'auto'>;
  const positiveOnly = method === 'cox' || method === 'land' || method === 'gamma';
  if (positiveOnly && summary.positive < n) {
    warnings.push(
      `The ${LABELS[method]} needs every value above zero; ${n - summary.positive} value(s) are zero or negative, so Student t is used instead.`,
    );
    method = 't';
  }
  if (requested !== 'auto' && (requested === 'cox' || requested === 'land') && choice.method === 'gamma')
    warnings.push(
      'The values look gamma-shaped (their logarithms are skewed to the left), not lognormal: a log-scale method overestimates the mean of such data and its interval may miss it. Let the data choose the method (automatic) or choose the gamma-based interval.',
    );
  if ((method === 'cox' || method === 'land') && population !== undefined)
    warnings.push('The log-scale methods ignore the population size (no finite population correction).');
  const logStats = { n, logMean: summary.logMean, logSd: summary.logSd };
  const distinct = summary.distinct;
  const allPositive = summary.positive === n;
  /** The figures shown with the assessment — built on first read (replay and the benchmark never read them). */
  const buildDetails = (): Details => {
    const details: Details = {
      sd: n >= 2 ? sd : null,
      se: n >= 2 ? sd / Math.sqrt(n) : null,
      cv: n >= 2 && mean !== 0 ? sd / Math.abs(mean) : null,
      distinct,
    };
    if (allPositive && n >= 2) {
      details.logMean = logStats.logMean;
      details.logSd = logStats.logSd;
    }
    if (population !== undefined) details.population = population;
    if (requested === 'auto') details.methodChoice = { ...choice, method };
    return details;
  };
  if (requested === 't' && choice.method !== 't')
    warnings.push(
      `Student t was chosen for this study, but the data suggest another interval (${LABELS[choice.method as MeasurementMethod]}: ${choice.reason}); on skewed data the Student t interval may be too narrow. Let the data choose the method (automatic).`,
    );

  let estimate: number | null = n >= 1 ? mean : null;
  if ((method === 'cox' || method === 'land') && n >= 2)
    estimate = Math.exp(summary.logMean + summary.logSd ** 2 / 2);

  const intervalAt =
    n < 2
      ? null
      : (level: number, sided: Sided) => {
          // the skew-aware intervals need spread (and the gamma shape four values): Student t until then
          const m =
            (method === 'gamma' && (n < 4 || !(summary.logSd > 0))) || (method === 'johnson-t' && !(sd > 0))
              ? 't'
              : method;
          switch (m) {
            case 't': {
              const r = studentTInterval({ n, mean, sd }, level, sided, population);
              return { estimate: r.estimate, lower: r.lower, upper: r.upper, se: r.se };
            }
            case 'johnson-t': {
              const r = johnsonTInterval({ n, mean, sd, m3: summary.m3 }, level, sided, population);
              return { estimate: r.estimate, lower: r.lower, upper: r.upper, se: r.se };
            }
            case 'gamma': {
              const r = gammaMeanInterval({ n, mean, logMean: summary.logMean }, level, sided);
              return { estimate: r.estimate, lower: r.lower, upper: r.upper, se: r.se };
            }
            case 'chebyshev': {
              const r = chebyshevBound({ n, mean, sd }, level, sided, population);
              return { estimate: r.estimate, lower: r.lower, upper: r.upper, se: r.se };
            }
            case 'cox': {
              const r = modifiedCoxInterval(logStats, level, sided);
              // SE of the estimate on the data scale by the delta method: estimate × log-scale SE
              return { estimate: r.estimate, lower: r.lower, upper: r.upper, se: r.estimate * r.logSe };
            }
            case 'land': {
              const r = landInterval(logStats, level, sided);
              // the Cox standard error (modified-cox-interval.ts: estimate × log-scale SE), which does not
              // depend on the level, so no t quantile is asked at each entry's moving level
              const s2 = logStats.logSd * logStats.logSd;
              const coxEstimate = Math.exp(logStats.logMean + s2 / 2);
              const logSe = Math.sqrt(s2 / n + (s2 * s2) / (2 * (n - 1)));
              return { estimate: r.estimate, lower: r.lower, upper: r.upper, se: coxEstimate * logSe };
            }
          }
        };

  const project = (target: Target, level: number, sided: Sided): Projection | null => {
    if (n < 2 || !(sd > 0)) return null;
    const p = target.kind === 'limit' ? level : quantileProbability(level, sided);
    const alpha = 1 - level;
    const multiplier =
      method === 'chebyshev'
        ? sided === 'two' && target.kind !== 'limit'
          ? 1 / Math.sqrt(alpha)
          : Math.sqrt(1 / alpha - 1)
        : undefined;
    // heavy tails widen the σ distribution behind the range (Box 1953, src/plan/box-variance-df.ts)
    // (the bias-corrected G₂, not g₂: a small sample reads heavy tails too light)
    const g2 = summary.kurtosis;
    const kurtosis = g2 === null ? null : adjustedExcessKurtosis(n, g2);
    const withPop = population === undefined ? { kurtosis } : { population, kurtosis };
    const withMult = multiplier === undefined ? {} : { multiplier };
    switch (target.kind) {
      case 'margin': {
        const r = projectMeasurement({ n, s: sd, d: target.value, p, ...withPop, ...withMult });
        return { ...r, basis: 'fixed point n = (t·s/D)², range from the chi-square distribution of σ' };
      }
      case 'relative': {
        if (!(estimate !== null && estimate > 0)) return null;
        if (method === 'cox' || method === 'land') {
          const s = summary.logSd;
          if (!(s > 0)) return null;
          const at = (sy: number) => logScaleRelativeSampleSize(sy, target.value, p, sided);
          const logG2 = summary.logKurtosis;
          const df = logG2 === null ? n - 1 : boxVarianceDf(n, adjustedExcessKurtosis(n, logG2));
          return {
            likely: at(sigmaQ(s, n, 0.5, df)),
            low: at(sigmaQ(s, n, 0.1, df)),
            high: at(sigmaQ(s, n, 0.9, df)),
            assured: at(sigmaQ(s, n, 0.8, df)),
            basis:
              'log-scale (Cox) half-width exp(t·SE) − 1 ≤ R, range from the chi-square distribution of σ of ln x',
          };
        }
        const r = projectMeasurement({ n, s: sd, d: target.value * estimate, p, ...withPop, ...withMult });
        return {
          ...r,
          basis: 'fixed point n = (t·s/(R·mean))², range from the chi-square distribution of σ',
        };
      }
      case 'precision': {
        if (!(estimate !== null && estimate > 0)) return null;
        const r = projectMeasurement({ n, s: sd, d: target.value * estimate, p, ...withPop, multiplier: 1 });
        return { ...r, basis: 'n = (s/(D·mean))², range from the chi-square distribution of σ' };
      }
      case 'limit': {
        if (estimate === null) return null;
        const c =
          multiplier === undefined ? (total: number) => tQuantileAtRealDf(p, total - 1) : () => multiplier;
        const r = projectLimitDecision({
          n,
          distance: estimate - target.value,
          // σ's median rather than s, as for the other targets: s under-reads σ more often than not
          spread: sigmaQ(sd, n, 0.5, kurtosis === null ? n - 1 : boxVarianceDf(n, kurtosis)),
          multiplier: c,
          ...(population === undefined ? {} : { population }),
        });
        return {
          ...r,
          basis:
            'predictive distribution of the mean: the total at which the one-sided bound clears the limit, median and 10th–90th percentiles',
        };
      }
    }
  };

  let guard: Estimator['guard'] = null;
  if (n >= 1 && distinct === 1) guard = oneValueGuard('value');
  else if (n >= 2 && !(sd > 1e-12 * Math.max(1, Math.abs(mean))))
    guard = {
      reason: 'zero-spread',
      message: 'The values show no spread; the interval cannot be trusted yet.',
    };

  return {
    method,
    label: (level, sided) => `${LABELS[method]}, ${sidedWords(level, sided)}`,
    estimate,
    intervalAt,
    guard,
    details: buildDetails,
    warnings: () => warnings,
    project,
  };
}
