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
  /** True when the study's setup or some entry calls for a design-based estimate. */
  design: boolean;
  private readonly halfLimit: boolean;
  private readonly limit: number | null;

  constructor(readonly setup: AnalysisSetup) {
    this.strata = (setup.strata ?? []).map((s) => new StratumState(s.name, s.weight));
    for (const s of this.strata) this.stratumByName.set(s.name, s);
    this.design = this.strata.length > 0 || setup.design === 'composite';
    this.halfLimit = setup.nonDetects === 'half-limit';
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
    this.pointMoments.add(value);
    this.units.add(value, undefined);
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
    this.pointMoments.add(p.value);
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
