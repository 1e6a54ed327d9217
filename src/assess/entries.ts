/**
 * The counted entries of a study as running sums, so that every estimator — the three data kinds and every
 * field design — reads them in O(1) or O(strata) per entry instead of regrouping the whole list:
 * - the data kind's RunningSummary (moments, log moments, distinct values) over the detected values;
 * - per stratum, a RunningSummary and the primary units' running moments (UnitMoments);
 * - over the whole study, the primary units' running moments;
 * - the values in entry order (stopping rules that look back) and the points themselves (Kaplan–Meier sorts
 *   them, which is the one O(n log n) step, taken only when non-detects are present).
 * Entries are only ever added here: a void or a correction rebuilds the state from the counted entries
 * (running.ts), so nothing is ever subtracted from a float sum.
 */
import { type ClusterRatioResult, clusterRatioFromSums } from '../design/cluster-ratio-mean.ts';
import { UnitMoments } from '../design/unit-moments.ts';
import type { AnalysisSetup, Point } from '../model/types.ts';
import { RunningMoments } from '../stats/running-moments.ts';
import { RunningSummary } from '../stats/running-summary.ts';

/**
 * The first entry whose arrival more than doubled the sample SD of the entries before it, when at least
 * SPREAD_JUMP_MIN came before. The SD ratio with and without one value is Grubbs's statistic for that value
 * (Grubbs FE (1950) Sample criteria for testing outlying observations, Ann. Math. Stat. 21:27–58: the ratio
 * of the sums of squares without and with the suspect value); a doubling is our fixed threshold, chosen
 * because (a) it needs the new value about √(3n) SDs from the mean (5.5 SDs at n = 10, 9 at n = 29), which
 * near-normal data almost never give, while one value from a hot area ten times the background gives it,
 * and (b) from 10 entries on the SD itself is known to within less than a factor of two (its one-sided 95 %
 * upper bound is 1.65·s at 9 degrees of freedom), so a doubling is not the SD's own uncertainty.
 * A flag, never a verdict: skewed data (lognormal CV ≥ 1) can give it without a hot area.
 */
export interface SpreadJump {
  /** The entry's number among the counted entries (1-based). */
  entry: number;
  value: number;
  /** SD after the entry / SD before it. */
  ratio: number;
}
export const SPREAD_JUMP_MIN = 10;

/** Primary units (transects, rooms) of one group: the whole study, or one stratum. */
export class UnitGroup {
  readonly moments = new UnitMoments();
  private readonly units = new Map<string, { total: number; size: number }>();
  totalY = 0;
  totalM = 0;
  /** Entries that named a primary unit. */
  named = 0;

  add(value: number, cluster: string | undefined): void {
    this.totalY += value;
    this.totalM += 1;
    // an entry without a primary unit is a unit of its own
    if (cluster === undefined) {
      this.moments.add(value, 1);
      return;
    }
    this.named++;
    const unit = this.units.get(cluster);
    if (unit === undefined) {
      this.units.set(cluster, { total: value, size: 1 });
      this.moments.add(value, 1);
      return;
    }
    this.moments.remove(unit.total, unit.size);
    unit.total += value;
    unit.size += 1;
    this.moments.add(unit.total, unit.size);
  }

  /** Named primary units seen. */
  get namedUnits(): number {
    return this.units.size;
  }

  /** The ratio mean over the units (each entry without a unit is a unit of its own). */
  ratio(): ClusterRatioResult {
    return clusterRatioFromSums({
      units: this.moments.units,
      totalY: this.totalY,
      totalM: this.totalM,
      residualSS: this.moments.residualSumOfSquares(),
    });
  }
}

/** One declared stratum's running state. */
export class StratumState {
  readonly summary = new RunningSummary();
  readonly units = new UnitGroup();
  constructor(
    readonly name: string,
    readonly weight: number,
  ) {}
}

export class EntryState {
  /** The data kind's summary over the detected values (non-detects are counted in `censored` only). */
  readonly summary = new RunningSummary();
  /** Detected values in entry order. */
  readonly values: number[] = [];
  /** Every counted point as the estimators see it (half the reporting limit when substitution was chosen). */
  readonly points: Point[] = [];
  /** Values of `points` in entry order, non-detects at their reporting limit (the design rules' context). */
  readonly pointValues: number[] = [];
  readonly pointMoments = new RunningMoments();
  /** Primary units over the whole study. */
  readonly units = new UnitGroup();
  /** Declared strata, in declared order (empty when the study has none). */
  readonly strata: StratumState[];
  private readonly stratumByName = new Map<string, StratumState>();
  /** Entries whose stratum is not declared. */
  stray = 0;
  /** Non-detects still censored (Kaplan–Meier applies). */
  censored = 0;
  /** Non-detects replaced by half their reporting limit (as chosen). */
  substituted = 0;
  /** Non-detects whose reporting limit is at or above a limit target. */
  censoredAtOrAboveLimit = 0;
  /** The first entry that doubled the spread (measurements and counts), or null. */
  spreadJump: SpreadJump | null = null;
  /** True when the study's setup or some entry calls for a design-based estimate. */
  design: boolean;
  private readonly halfLimit: boolean;
  private readonly watchSpread: boolean;
  private readonly limit: number | null;

  constructor(readonly setup: AnalysisSetup) {
    this.strata = (setup.strata ?? []).map((s) => new StratumState(s.name, s.weight));
    for (const s of this.strata) this.stratumByName.set(s.name, s);
    this.design = this.strata.length > 0 || setup.design === 'composite';
    this.halfLimit = setup.nonDetects === 'half-limit';
    // a pass/fail item's spread follows from the share alone: the first defect is no jump in a site's values
    this.watchSpread = setup.kind !== 'pass-fail';
    this.limit = setup.target?.kind === 'limit' ? setup.target.value : null;
  }

  /** Counted entries (non-detects included). */
  get n(): number {
    return this.points.length;
  }

  /** Sample SD of `pointValues` (0 below two entries). */
  get pointSd(): number {
    const m = this.pointMoments;
    return m.n < 2 ? 0 : Math.sqrt(Math.max(0, m.m2) / (m.n - 1));
  }

  /** The hot path of replay: a plain detected value, no stratum, no primary unit. */
  addValue(value: number): void {
    if (this.design) {
      this.add({ value });
      return;
    }
    if (!Number.isFinite(value)) throw new RangeError('assess requires finite values');
    this.summary.add(value);
    this.values.push(value);
    this.points.push({ value });
    this.pointValues.push(value);
    this.addMoment(value);
    this.units.add(value, undefined);
  }

  /** Adds to the running moments, noting the first spread jump (O(1)). */
  private addMoment(value: number): void {
    const m = this.pointMoments;
    if (!this.watchSpread || this.spreadJump !== null || m.n < SPREAD_JUMP_MIN) {
      m.add(value);
      return;
    }
    const before = Math.max(0, m.m2) / (m.n - 1);
    m.add(value);
    const after = Math.max(0, m.m2) / (m.n - 1);
    if (before > 0 && after >= 4 * before)
      this.spreadJump = { entry: m.n, value, ratio: Math.sqrt(after / before) };
  }

  add(entry: Point): void {
    if (!Number.isFinite(entry.value)) throw new RangeError('assess requires finite values');
    let p = entry;
    if (p.censored === true) {
      if (this.limit !== null && p.value >= this.limit) this.censoredAtOrAboveLimit++;
      if (this.halfLimit) {
        p = { ...p, value: p.value / 2 };
        delete p.censored;
        this.substituted++;
      } else this.censored++;
      this.design = true;
    }
    if (p.cluster !== undefined) this.design = true;
    this.summary.add(p);
    if (p.censored !== true) this.values.push(p.value);
    this.points.push(p);
    this.pointValues.push(p.value);
    this.addMoment(p.value);
    this.units.add(p.value, p.cluster);
    if (this.strata.length > 0) {
      const s = p.stratum === undefined ? undefined : this.stratumByName.get(p.stratum);
      if (s === undefined) this.stray++;
      else {
        s.summary.add(p);
        s.units.add(p.value, p.cluster);
      }
    }
  }
}
