/**
 * Where next — the stratum where one more entry makes the stratified mean most precise per unit of effort.
 *
 * Source: derived here from the stratified variance of Cochran WG (1977) Sampling Techniques, 3rd ed., §5.3,
 * V = Σ W_h² S_h² (1/n_h − 1/N_h). One more entry in stratum h lowers V by
 *   Δ_h = W_h² S_h² [1/n_h − 1/(n_h + 1)] = W_h² S_h² / (n_h (n_h + 1))
 * (the 1/N_h term of the finite population correction cancels). The suggestion is the stratum with the
 * largest Δ_h / c_h, c_h the effort (cost, minutes) of one entry there. Taking the best step each time is
 * the greedy (marginal) allocation; for equal costs it gives the optimal whole-number allocation for every
 * total (Wright T (2012) The equivalence of Neyman optimum allocation for sampling and equal proportions
 * for apportioning the U.S. House of Representatives, Am Stat 66:217–224 [memory]), and where it settles,
 * W_h² S_h² / (n_h² c_h) ≈ constant, i.e. n_h ∝ W_h S_h / √c_h — Neyman's allocation with cost (Cochran §5.5).
 * App choices [derived]: a stratum with fewer than two entries comes first (its spread is unknown; the one
 * with the fewest entries, then the largest weight); a stratum whose entries so far are all equal uses the
 * pooled within-stratum SD instead of 0 (two equal values do not show that it has no spread); if every
 * stratum shows no spread, equal SDs are assumed; a stratum whose N_h units are all measured is skipped.
 * Preconditions: at least one stratum; weight > 0, n ≥ 0 integer, sd ≥ 0, cost > 0 (default 1),
 * population ≥ n when given.
 * Returns: `suggest` with the stratum, the reason and the variance reduction per unit cost of every stratum;
 * or `none` when every stratum is fully measured.
 * Validity: a one-step look-ahead with the current SD estimates; early SDs are noisy, so the suggestion may
 * change from entry to entry.
 * @example whereNext([{ name: 'a', weight: 0.5, n: 5, sd: 1 }, { name: 'b', weight: 0.5, n: 5, sd: 3 }])
 *   // { status: 'suggest', stratum: 'b', reason: 'largest-reduction', … }
 */
export interface WhereNextStratum {
  name: string;
  weight: number;
  n: number;
  sd: number;
  /** Effort of one entry in this stratum (any unit; default 1). */
  cost?: number;
  /** Stratum size N_h (units), when finite. */
  population?: number;
}

export type WhereNextReason = 'needs-two' | 'largest-reduction' | 'equal-spread-assumed';

export type WhereNext =
  | {
      status: 'suggest';
      stratum: string;
      index: number;
      reason: WhereNextReason;
      /** Variance reduction per unit cost of one more entry, per stratum (null: not computed / complete). */
      gains: (number | null)[];
      message: string;
    }
  | { status: 'none'; message: string };

export function whereNext(strata: readonly WhereNextStratum[]): WhereNext {
  if (strata.length === 0) throw new RangeError('whereNext requires at least one stratum');
  let weightSum = 0;
  for (const s of strata) {
    if (!(s.weight > 0)) throw new RangeError('whereNext requires every weight > 0');
    if (!(Number.isInteger(s.n) && s.n >= 0)) throw new RangeError('whereNext requires every n >= 0');
    if (!(s.sd >= 0)) throw new RangeError('whereNext requires every sd >= 0');
    if (!((s.cost ?? 1) > 0)) throw new RangeError('whereNext requires every cost > 0');
    if (s.population !== undefined && !(s.population >= s.n))
      throw new RangeError('whereNext requires population >= n');
    weightSum += s.weight;
  }
  const open = strata.map((s) => s.population === undefined || s.n < s.population);
  if (!open.some(Boolean))
    return { status: 'none', message: 'Every unit of every stratum has been measured.' };

  // 1. A stratum with fewer than two entries: its spread cannot be estimated yet.
  let pick = -1;
  strata.forEach((s, i) => {
    if (!open[i] || s.n >= 2) return;
    const best = pick < 0 ? undefined : strata[pick]!;
    if (best === undefined || s.n < best.n || (s.n === best.n && s.weight > best.weight)) pick = i;
  });
  if (pick >= 0) {
    const s = strata[pick]!;
    return {
      status: 'suggest',
      stratum: s.name,
      index: pick,
      reason: 'needs-two',
      gains: strata.map(() => null),
      message: `Next in ${s.name}: it has ${s.n} ${s.n === 1 ? 'entry' : 'entries'}; every stratum needs at least two before its spread can be estimated.`,
    };
  }

  // 2. Largest variance reduction per unit cost.
  let pooledNum = 0;
  let pooledDen = 0;
  for (const s of strata) {
    pooledNum += (s.n - 1) * s.sd * s.sd;
    pooledDen += s.n - 1;
  }
  const pooled = pooledDen > 0 ? Math.sqrt(pooledNum / pooledDen) : 0;
  const equalAssumed = pooled === 0;
  const gains = strata.map((s, i) => {
    if (!open[i]) return null;
    const w = s.weight / weightSum;
    const sd = equalAssumed ? 1 : s.sd > 0 ? s.sd : pooled;
    return (w * w * sd * sd) / (s.n * (s.n + 1)) / (s.cost ?? 1);
  });
  let best = -1;
  gains.forEach((g, i) => {
    if (g !== null && (best < 0 || g > gains[best]!)) best = i;
  });
  const s = strata[best]!;
  return {
    status: 'suggest',
    stratum: s.name,
    index: best,
    reason: equalAssumed ? 'equal-spread-assumed' : 'largest-reduction',
    gains,
    message: equalAssumed
      ? `Next in ${s.name}: no stratum shows any spread yet, so the one with the most weight per entry so far comes first.`
      : `Next in ${s.name}: one more entry there narrows the interval most for the effort${strata.some((x) => x.cost !== undefined) ? ' (per-stratum effort counted)' : ''}.`,
  };
}
