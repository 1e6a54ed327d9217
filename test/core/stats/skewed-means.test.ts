// The skewed-data pieces of the measurement interval choice, against scipy (test/fixtures/stats-skewed-means.json,
// made by `python3 test/fixtures/stats-skewed-means.py`, scipy version in the file) [derived, scipy]:
// D'Agostino's skewness z (scipy.stats.skewtest), the running third moment (scipy.stats.skew), the
// gamma-based interval of Grice & Bain (1980) with the exact MLE shape (brentq on the digamma equation),
// Johnson's (1978) first-order modified t; the method choice from scipy's z of the values and of their logs.
import { describe, expect, it } from 'vitest';
import { chooseMeasurementMethod } from '../../../src/assess/method-choice.ts';
import { dagostinoSkewnessZ } from '../../../src/stats/dagostino-skewness-test.ts';
import { gammaMeanInterval } from '../../../src/stats/gamma-mean-interval.ts';
import { johnsonTInterval } from '../../../src/stats/johnson-t-interval.ts';
import { RunningSummary } from '../../../src/stats/running-summary.ts';
import fixture from '../../fixtures/stats-skewed-means.json' with { type: 'json' };

const relClose = (got: number, want: number, tol: number) =>
  expect(Math.abs(got - want), `${got} vs ${want}`).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(want)));

describe.each(fixture.cases)('$kind, n = $values.length', (c) => {
  const s = RunningSummary.of(c.values);
  const n = c.values.length;
  it('moment skewness of the values and of their logarithms (scipy.stats.skew, bias=True)', () => {
    relClose(s.skewness as number, c.skew, 1e-9);
    relClose(s.logSkewness as number, c.logSkew, 1e-9);
  });
  it('moment kurtosis g₂ of the values and of their logarithms (scipy.stats.kurtosis, bias=True), also after a removal', () => {
    relClose(s.kurtosis as number, c.kurtosis, 1e-8);
    relClose(s.logKurtosis as number, c.logKurtosis, 1e-8);
    // the running sums run backwards: add one value and take it away again
    const again = RunningSummary.of(c.values).add(123.456).remove(123.456);
    relClose(again.kurtosis as number, c.kurtosis, 1e-7);
    relClose(again.skewness as number, c.skew, 1e-7);
  });
  it("D'Agostino's z (scipy.stats.skewtest)", () => {
    relClose(dagostinoSkewnessZ(n, s.skewness as number), c.z, 1e-9);
    relClose(dagostinoSkewnessZ(n, s.logSkewness as number), c.logZ, 1e-9);
  });
  it('gamma-based interval: shape and bounds (Greenwood–Durand shape within 1e-4 of the exact MLE)', () => {
    const two = gammaMeanInterval({ n, mean: s.mean, logMean: s.logMean }, 0.95, 'two');
    relClose(two.shape, c.gammaShape, 2e-4);
    relClose(two.lower, c.gamma95two[0]!, 1e-4);
    relClose(two.upper, c.gamma95two[1]!, 1e-4);
    const up = gammaMeanInterval({ n, mean: s.mean, logMean: s.logMean }, 0.95, 'upper');
    relClose(up.upper, c.gamma95upper, 1e-4);
  });
  // jstat's t quantile is good to about 6e-8 (src/stats/README.md, "jstat's accuracy")
  it("Johnson's modified t", () => {
    const two = johnsonTInterval({ n, mean: s.mean, sd: s.sd, m3: s.m3 }, 0.95, 'two');
    relClose(two.lower, c.johnson95two[0]!, 1e-7);
    relClose(two.upper, c.johnson95two[1]!, 1e-7);
    relClose(
      johnsonTInterval({ n, mean: s.mean, sd: s.sd, m3: s.m3 }, 0.95, 'upper').upper,
      c.johnson95upper,
      1e-7,
    );
  });
  it('the choice: Student t unless skewed (skewtest z ≥ 1.645), then gamma when the logarithms lean left (their z ≤ −1.645), Johnson’s t when they lean right (z ≥ 1.645), else the log scale', () => {
    const z = 1.6448536269514722;
    const want = c.z < z ? 't' : c.logZ <= -z ? 'gamma' : c.logZ >= z ? 'johnson-t' : 'cox';
    expect(chooseMeasurementMethod(s).method).toBe(want);
  });
});

describe('the choice below 8 values and with values at or below zero', () => {
  it('fewer than 8 values: Student t, saying why', () => {
    const c = chooseMeasurementMethod(RunningSummary.of([1, 2, 30, 4, 5, 6, 7]));
    expect(c).toMatchObject({ method: 't', criterion: { n: 7 } });
    expect(c.reason).toMatch(/fewer than 8/);
  });
  it('a value at or below zero: Johnson’s t when skewed to the right (skewtest z ≥ 1.645), else Student t', () => {
    // z for this sample from scipy.stats.skewtest: 4.01 (computed once: python3 -c "from scipy import stats;
    // print(stats.skewtest([-1,0,1,1,2,2,2,3,3,4,30]).statistic)")
    const skewed = RunningSummary.of([-1, 0, 1, 1, 2, 2, 2, 3, 3, 4, 30]);
    expect(chooseMeasurementMethod(skewed)).toMatchObject({ method: 'johnson-t' });
    const even = RunningSummary.of([-2, -1, 0, 1, 2, -1.5, 0.5, 1.5, -0.5, 0]);
    expect(chooseMeasurementMethod(even)).toMatchObject({ method: 't' });
  });
});
