/**
 * Confidence sequence for a pass/fail rate — an interval that stays valid however often you look.
 *
 * For a field user: an ordinary 95 % interval is right 95 % of the time only if you decide the number of
 * items in advance. This interval is wider, but it is right at every entry at once: the chance that it
 * ever misses the true rate, at any point while you keep inspecting, is at most 5 %. You may stop the
 * moment it is narrow enough.
 *
 * Source: the conjugate (beta–binomial) mixture martingale of Robbins H (1970) Statistical methods related
 * to the law of the iterated logarithm, Ann. Math. Stat. 41:1397–1409, in the framework of Howard SR,
 * Ramdas A, McAuliffe J, Sekhon J (2021) Time-uniform, nonparametric, nonasymptotic confidence sequences,
 * Ann. Statist. 49:1055–1080 (§3, conjugate mixtures). For Sₙ counted outcomes in n items and a
 * Beta(a, b) mixing density,
 *   Mₙ(p) = B(a + Sₙ, b + n − Sₙ) / (B(a, b) · p^{Sₙ} (1 − p)^{n−Sₙ})
 * is a nonnegative martingale with M₀ = 1 under rate p, so by Ville's inequality
 * P(∃n: Mₙ(p) ≥ 1/α) ≤ α and Cₙ = {p : ln Mₙ(p) < ln(1/α)} is a (1 − α) confidence sequence. We use
 * a = b = ½ (no tuning to a planned size). ln Mₙ is convex in p, so Cₙ is an interval; its ends are found
 * by safeguarded Newton iteration from the inside.
 *
 * Preconditions: integers 0 ≤ S ≤ n, n ≥ 1, 0 < level < 1.
 * Returns: lower and upper bounds in [0, 1] (lower 0 when S = 0, upper 1 when S = n are possible).
 * Validity: any sequence of independent items with a common rate (sampling with replacement or from a
 * large lot); for a small finite lot it is conservative. The bound is two-sided at level 1 − α.
 *
 * @example betaBinomialConfidenceSequence(50, 100, 0.95) // about { lower: 0.36, upper: 0.64 }
 */
import { logGamma } from '../stats/distributions.ts';

const HALF_LOG_BETA = Math.log(Math.PI); // ln B(½, ½) = ln π

function logBeta(a: number, b: number): number {
  return logGamma(a) + logGamma(b) - logGamma(a + b);
}

export function betaBinomialConfidenceSequence(
  S: number,
  n: number,
  level: number,
): { lower: number; upper: number } {
  if (!Number.isInteger(S) || !Number.isInteger(n) || n < 1 || S < 0 || S > n)
    throw new RangeError('betaBinomialConfidenceSequence requires integers 0 <= S <= n, n >= 1');
  if (!(level > 0 && level < 1))
    throw new RangeError('betaBinomialConfidenceSequence requires 0 < level < 1');
  const F = n - S;
  const c = logBeta(0.5 + S, 0.5 + F) - HALF_LOG_BETA - Math.log(1 / (1 - level));
  // f(p) = c − S ln p − F ln(1 − p); the sequence is {p : f(p) < 0}. f is convex with minimum at S/n.
  const f = (p: number) => c - (S > 0 ? S * Math.log(p) : 0) - (F > 0 ? F * Math.log1p(-p) : 0);
  const df = (p: number) => -S / p + F / (1 - p);
  const phat = S / n;
  const root = (from: number, toward: 0 | 1): number => {
    // from: a point inside (f < 0). Move toward the edge until f ≥ 0 by bisection + Newton.
    let inside = from;
    let outside: number = toward;
    let p = toward === 1 ? (from + 1) / 2 : from / 2;
    for (let i = 0; i < 200; i++) {
      const fp = f(p);
      if (fp < 0) inside = p;
      else outside = p;
      if (Math.abs(outside - inside) < 1e-13) break;
      const d = df(p);
      let next = p - fp / d;
      if (!(next > Math.min(inside, outside) && next < Math.max(inside, outside)))
        next = (inside + outside) / 2;
      if (Math.abs(next - p) < 1e-14) {
        p = next;
        break;
      }
      p = next;
    }
    return toward === 1 ? Math.max(inside, outside) : Math.min(inside, outside);
  };
  if (f(Math.min(Math.max(phat, 1e-300), 1 - 1e-16)) >= 0) return { lower: phat, upper: phat };
  const start = phat === 0 ? 0 : phat === 1 ? 1 : phat;
  return {
    lower: phat === 0 ? 0 : root(start, 0),
    upper: phat === 1 ? 1 : root(start, 1),
  };
}
