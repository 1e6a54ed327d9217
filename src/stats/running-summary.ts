/**
 * Running summary — the sufficient statistics of a study's observations, updated in O(1) per entry
 * added or removed, so the interval can be recomputed after every entry without rereading the data.
 *
 * Source: Welford BP (1962) Note on a method for calculating corrected sums of squares and products,
 * Technometrics 4:419–420 (the running mean / sum of squared deviations); removal is the same update
 * run backwards (Chan, Golub & LeVeque 1983, Am Stat 37:242–247, give the pairwise/updating forms).
 * Preconditions: values are finite numbers; `remove` must be given a value that was added.
 * Returns: n, mean, sample variance (divisor n − 1), the same moments of ln(x) over the positive values,
 * the counts of zeros / negatives / censored points, the total, and the number of distinct values.
 * Validity: removal loses a little precision after very many add/remove cycles (relative ~1e-12 per
 * cycle); censored points (`<RL`) are counted and kept apart from the moments.
 * @example
 * const s = new RunningSummary(); for (const v of [2, 4, 4, 5]) s.add(v); s.mean // 3.75, s.sd // 1.258…
 */
import type { Point } from '../model/types.ts';

export class RunningSummary {
  /** Number of uncensored observations in the moments. */
  n = 0;
  mean = 0;
  /** Sum of squared deviations from the mean. */
  m2 = 0;
  total = 0;
  /** Number of values > 0 (the log moments run over these). */
  positive = 0;
  logMean = 0;
  logM2 = 0;
  zeros = 0;
  negative = 0;
  /** Censored points (`<RL`), kept out of the moments; their reporting limits are in `censoredValues`. */
  censored = 0;
  censoredValues: number[] = [];
  private readonly counts = new Map<number, number>();

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
    this.n++;
    const d = x - this.mean;
    this.mean += d / this.n;
    this.m2 += d * (x - this.mean);
    this.total += x;
    if (x > 0) {
      const y = Math.log(x);
      this.positive++;
      const dy = y - this.logMean;
      this.logMean += dy / this.positive;
      this.logM2 += dy * (y - this.logMean);
    } else if (x === 0) this.zeros++;
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
    if (this.n === 1) {
      this.n = 0;
      this.mean = 0;
      this.m2 = 0;
      this.total = 0;
    } else {
      const oldMean = this.mean;
      this.mean = (this.n * oldMean - x) / (this.n - 1);
      this.m2 = Math.max(0, this.m2 - (x - oldMean) * (x - this.mean));
      this.n--;
      this.total -= x;
    }
    if (x > 0) {
      const y = Math.log(x);
      if (this.positive === 1) {
        this.positive = 0;
        this.logMean = 0;
        this.logM2 = 0;
      } else {
        const old = this.logMean;
        this.logMean = (this.positive * old - y) / (this.positive - 1);
        this.logM2 = Math.max(0, this.logM2 - (y - old) * (y - this.logMean));
        this.positive--;
      }
    } else if (x === 0) this.zeros--;
    else this.negative--;
    // With one distinct value left the spread is exactly zero; clear the rounding residue of removals.
    if (this.counts.size === 1) {
      this.m2 = 0;
      const only = this.counts.keys().next().value as number;
      this.mean = only;
      if (only > 0) {
        this.logMean = Math.log(only);
        this.logM2 = 0;
      }
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
