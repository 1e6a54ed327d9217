/**
 * Composite (incremental-sampling) upper bound — an upper confidence limit for the mean of a decision unit
 * from r replicate composite samples, each the mean of many increments.
 *
 * Source: ITRC (2012, updated 2020) Incremental Sampling Methodology, ISM-1, §4.2.2.2 and §4.3.4.1:
 * one-sided UCL by Student t, x̄ + t₍1−α, r−1₎ · s/√r, or by Chebyshev, x̄ + √(1/α − 1) · s/√r, from
 * r ≥ 3 replicates (typically 3); a single ISM sample gives no estimate of the variance and therefore no
 * bound [secondary]. Chebyshev form as in USEPA (2002) OSWER 9285.6-10.
 * Preconditions: replicate results (each composite's measured value, data units); 0 < level < 1.
 * Returns: `ok` with r, mean, SD (divisor r − 1), the t-UCL and the Chebyshev UCL at `level`; `no-bound`
 * with one composite (and zero), saying why.
 * Validity: replicates must be independent composites over the whole decision unit (not splits of one
 * composite); with r = 2 the t-UCL is very wide; the Chebyshev UCL is conservative for moderate skew.
 * @example compositeUcl([10, 12, 14], 0.95) // { status: 'ok', mean: 12, tUcl: 15.371…, chebyshevUcl: 17.034… }
 */
import { studentTQuantile } from '../stats/distributions.ts';
import { RunningMoments } from '../stats/running-moments.ts';

export type CompositeUclResult =
  | {
      status: 'ok';
      replicates: number;
      mean: number;
      sd: number;
      se: number;
      tUcl: number;
      chebyshevUcl: number;
    }
  | { status: 'no-bound'; replicates: number; message: string };

export function compositeUcl(results: readonly number[], level: number): CompositeUclResult {
  if (!(level > 0 && level < 1)) throw new RangeError('compositeUcl requires 0 < level < 1');
  for (const x of results)
    if (!Number.isFinite(x)) throw new RangeError('compositeUcl requires finite results');
  const r = results.length;
  if (r < 2)
    return {
      status: 'no-bound',
      replicates: r,
      message:
        r === 0
          ? 'No composite yet: an upper bound needs replicate composites (typically three).'
          : 'A single composite measures the mean of its increments but says nothing about how much another composite would differ, so it gives no upper bound. Collect replicate composites (typically three).',
    };
  const { mean, m2 } = RunningMoments.of(results);
  const sd = Math.sqrt(m2 / (r - 1));
  const se = sd / Math.sqrt(r);
  const alpha = 1 - level;
  return {
    status: 'ok',
    replicates: r,
    mean,
    sd,
    se,
    tUcl: mean + studentTQuantile(level, r - 1) * se,
    chebyshevUcl: mean + Math.sqrt(1 / alpha - 1) * se,
  };
}
