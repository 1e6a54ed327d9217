/**
 * The standard rule's internal confidence level — how much stricter than the claimed level the
 * interval must be before "enough" is said, per data kind.
 *
 * For a field user: if you look at the interval after every entry and stop the first time it is narrow
 * enough, you tend to stop on a lucky run of similar values, and the "95 %" interval then holds the true
 * value less often than 95 % of the time. Sure Enough therefore checks (and shows) a slightly wider
 * interval than the one you asked for; how much wider was measured by simulation so that the claim holds
 * within one percentage point in every benchmark situation with at least 25 planned observations.
 *
 * For an analyst: the internal tail probability is α_int = ρ_kind · α (α = 1 − level; for a two-sided
 * interval each tail gets α_int/2; for log-scale measurements ρ = ρ_log·exp(−κ·s_y²) with s_y the SD of
 * the logs so far, since the selection effect grows with the spread; for counts
 * ρ = max(0.3, ρ_count·exp(−0.7·(I − 1)·min(1, 25/n))) with I = s²/m the dispersion index so far), with
 * ρ_kind calibrated by the coverage benchmark (test/bench/coverage.md: its grid, replicates per cell and
 * common random numbers are stated there) as the largest ρ (smallest cost) for which every cell with
 * n* ≥ 25 covers ≥ nominal − 1 pp. The correction runs the naive rule at an inflated internal level
 * (src/stop/README.md, "Measured coverage"); its need follows from the second-order theory of Woodroofe (1977, Ann. Stat. 5:984–995: coverage deficit ≈ 0.41/n* at 95 % for
 * normal data) and is larger for skewed data. Counts additionally use the Chow–Robbins (1965, Ann. Math.
 * Stat. 36:457–462) variance floor s² + c/n with c = 1 count unit (see standard.ts).
 *
 * Preconditions: 0 < level < 1. Returns the internal level in (level, 1).
 * Validity: calibrated at nominal levels 0.80–0.99 by the ratio form; tested in the benchmark at 0.95.
 *
 * @example standardLevel({ kind: 'measurement', level: 0.95 }) // 0.96 when ρ = 0.8
 */
import type { AnalysisSetup } from '../model/types.ts';

/** Calibration groups: the interval family actually used decides how much the rule must be corrected. */
export type StandardGroup = 'measurement' | 'measurement-log' | 'count' | 'pass-fail';

/** ρ per group: internal α = ρ · nominal α. Values from test/bench/coverage.md (see there for the runs). */
export const STANDARD_ALPHA_RATIO: Readonly<Record<StandardGroup, number>> = {
  measurement: 0.9,
  'measurement-log': 0.75,
  count: 0.9,
  'pass-fail': 0.9,
};

/**
 * A limit decision stops the first time a one-sided bound clears the limit, which is a one-sided test
 * repeated after every entry: its error grows with the number of looks faster than a two-sided interval's
 * miss (the law of the iterated logarithm), so limit targets get a further factor on ρ, calibrated on the
 * benchmark's limit cells (test/bench/coverage.md) like the groups above.
 */
export const LIMIT_ALPHA_FACTOR: Readonly<Record<'limit', number>> = { limit: 0.7 };
/**
 * Measurements whose interval the data chose (method auto): a further factor on ρ, since the rule may stop
 * on whichever family happens to look narrow at that entry; calibrated on the measurement cells of the
 * benchmark (hot-spot mixtures left out: no factor rescues them). At most 1, like the limit factor.
 */
export const CHOICE_ALPHA_FACTOR: Readonly<Record<'choice', number>> = { choice: 0.8 };

export function standardGroup(setup: Pick<AnalysisSetup, 'kind' | 'method'>): StandardGroup {
  if (setup.kind === 'pass-fail') return 'pass-fail';
  if (setup.kind === 'count') return 'count';
  return setup.method === 'cox' || setup.method === 'land' ? 'measurement-log' : 'measurement';
}

/**
 * Log-scale measurements: the selection effect grows with the spread of the logs, so ρ shrinks with it:
 * ρ = ρ_log · exp(−κ·s_y²), κ fitted to the calibration runs at CV 0.5, 1 and 2 (s_y² = ln(1 + CV²)).
 */
export const LOG_SPREAD_KAPPA = 0.32;
/**
 * Counts: clumped counts need more correction, so ρ shrinks with the dispersion index I = s²/m:
 * ρ = max(COUNT_RHO_FLOOR, ρ_count · exp(−κ_c·(I − 1)·min(1, 25/n))) for I > 1 — the clumping penalty
 * fades with n, because the deficit of a t interval on clumped counts is a small-sample effect.
 */
export const COUNT_REFERENCE_N = 25;
export const COUNT_DISPERSION_KAPPA = 0.7;
export const COUNT_RHO_FLOOR = 0.3;

export function standardLevel(
  setup: Pick<AnalysisSetup, 'kind' | 'method' | 'level'> & { target?: AnalysisSetup['target'] },
  logSd: number | null = null,
  dispersionIndex: number | null = null,
  n = COUNT_REFERENCE_N,
  chosen = false,
): number {
  const { level } = setup;
  if (!(level > 0 && level < 1)) throw new RangeError('standardLevel requires 0 < level < 1');
  const group = standardGroup(setup);
  let rho = STANDARD_ALPHA_RATIO[group];
  if (group === 'measurement-log' && logSd !== null && logSd > 0)
    rho *= Math.exp(-LOG_SPREAD_KAPPA * logSd * logSd);
  if (group === 'count' && dispersionIndex !== null && dispersionIndex > 1)
    rho = Math.max(
      COUNT_RHO_FLOOR,
      rho * Math.exp(-COUNT_DISPERSION_KAPPA * (dispersionIndex - 1) * Math.min(1, COUNT_REFERENCE_N / n)),
    );
  if (setup.target?.kind === 'limit') rho *= LIMIT_ALPHA_FACTOR.limit;
  if (chosen) rho *= CHOICE_ALPHA_FACTOR.choice;
  return 1 - rho * (1 - level);
}
