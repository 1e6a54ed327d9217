/**
 * Running summary — the sufficient statistics of a study's observations, updated in O(1) per entry
 * added or removed, so the interval can be recomputed after every entry without rereading the data.
 *
 * Source: Welford BP (1962) Note on a method for calculating corrected sums of squares and products,
 * Technometrics 4:419–420 (the running mean / sum of squared deviations, in running-moments.ts, kept
 * for the values and for their logarithms); removal is the same update run backwards (Chan, Golub &
 * LeVeque 1983, Am Stat 37:242–247).
 * Preconditions: values are finite numbers; `remove` must be given a value that was added.
 * Returns: n, mean, sample variance (divisor n − 1), the same moments of ln(x) over the positive values,
 * the counts of zeros / negatives / censored points, the total, and the number of distinct values.
 * Validity: removal loses a little precision after very many add/remove cycles (relative ~1e-12 per
 * cycle); censored points (`<RL`) are counted and kept apart from the moments.
 * @example
 * const s = new RunningSummary(); for (const v of [2, 4, 4, 5]) s.add(v); s.mean // 3.75, s.sd // 1.258…
 */
import type { Point } from '../model/types.ts';
import { RunningMoments } from './running-moments.ts';

function momentSkewness(n: number, m2: number, m3: number): number | null {
  if (n < 3 || !(m2 > 0)) return null;
  return (Math.sqrt(n) * m3) / m2 ** 1.5;
}

function momentKurtosis(n: number, m2: number, m4: number): number | null {
  if (n < 4 || !(m2 > 0)) return null;
  return (n * m4) / (m2 * m2) - 3;
}

export class RunningSummary {
  /** Moments of the uncensored values, and of ln(x) over the positive ones. */
  private readonly raw = new RunningMoments();
  private readonly log = new RunningMoments();
  total = 0;
  zeros = 0;
  negative = 0;
  /** Censored points (`<RL`), kept out of the moments; their reporting limits are in `censoredValues`. */
  censored = 0;
  censoredValues: number[] = [];
  private readonly counts = new Map<number, number>();

  /** Number of uncensored observations in the moments. */
  get n(): number {
    return this.raw.n;
  }
  get mean(): number {
    return this.raw.mean;
  }
  /** Sum of squared deviations from the mean. */
  get m2(): number {
    return this.raw.m2;
  }
  /** Sum of cubed deviations from the mean (running-moments.ts). */
  get m3(): number {
    return this.raw.m3;
  }
  /** Number of values > 0 (the log moments run over these). */
  get positive(): number {
    return this.log.n;
  }
  get logMean(): number {
    return this.log.mean;
  }
  get logM2(): number {
    return this.log.m2;
  }
  /** Number of distinct uncensored values. */
  get distinct(): number {
    return this.counts.size;
  }
  /** Sample variance (divisor n − 1); 0 when n < 2. */
  get variance(): number {
    return this.n < 2 ? 0 : Math.max(0, this.m2) / (this.n - 1);
  }
  get sd(): number {
    return Math.sqrt(this.variance);
  }
  /**
   * Sample skewness √b₁ = √n·M3/M2^{3/2} of the values (the moment ratio D'Agostino's test uses); null below
   * three values or without spread.
   */
  get skewness(): number | null {
    return momentSkewness(this.raw.n, this.raw.m2, this.raw.m3);
  }
  /** The same of ln(x) over the positive values. */
  get logSkewness(): number | null {
    return momentSkewness(this.log.n, this.log.m2, this.log.m3);
  }
  /** Sample excess kurtosis g₂ = n·M4/M2² − 3 of the values; null below four values or without spread. */
  get kurtosis(): number | null {
    return momentKurtosis(this.raw.n, this.raw.m2, this.raw.m4);
  }
  /** The same of ln(x) over the positive values. */
  get logKurtosis(): number | null {
    return momentKurtosis(this.log.n, this.log.m2, this.log.m4);
  }
  /** Sample SD of ln(x) over the positive values; 0 when fewer than 2. */
  get logSd(): number {
    return this.positive < 2 ? 0 : Math.sqrt(Math.max(0, this.logM2) / (this.positive - 1));
  }

  add(point: Point | number): this {
    // a plain number is the common case (every entry of replay): no wrapper object
    const x = typeof point === 'number' ? point : point.value;
    if (!Number.isFinite(x)) throw new RangeError('RunningSummary.add requires a finite value');
    if (typeof point !== 'number' && point.censored) {
      this.censored++;
      this.censoredValues.push(x);
      return this;
    }
    this.raw.add(x);
    this.total += x;
    if (x > 0) this.log.add(Math.log(x));
    else if (x === 0) this.zeros++;
    else this.negative++;
    this.counts.set(x, (this.counts.get(x) ?? 0) + 1);
    return this;
  }

  remove(point: Point | number): this {
    const p = typeof point === 'number' ? { value: point } : point;
    const x = p.value;
    if (p.censored) {
      const i = this.censoredValues.lastIndexOf(x);
      if (i < 0) throw new RangeError('RunningSummary.remove requires a censored value that was added');
      this.censoredValues.splice(i, 1);
      this.censored--;
      return this;
    }
    const c = this.counts.get(x);
    if (c === undefined) throw new RangeError('RunningSummary.remove requires a value that was added');
    if (c === 1) this.counts.delete(x);
    else this.counts.set(x, c - 1);
    this.raw.remove(x);
    // The total restarts at exactly 0 when the last value goes, rather than keeping a rounding residue.
    this.total = this.raw.n === 0 ? 0 : this.total - x;
    if (x > 0) this.log.remove(Math.log(x));
    else if (x === 0) this.zeros--;
    else this.negative--;
    // With one distinct value left the spread is exactly zero; clear the rounding residue of removals.
    if (this.counts.size === 1) {
      const only = this.counts.keys().next().value as number;
      this.raw.settle(only);
      if (only > 0) this.log.settle(Math.log(only));
    }
    return this;
  }

  /** Builds a summary from a list of points or values. */
  static of(points: Iterable<Point | number>): RunningSummary {
    const s = new RunningSummary();
    for (const p of points) s.add(p);
    return s;
  }
}
