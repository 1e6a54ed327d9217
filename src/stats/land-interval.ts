/**
 * Land's exact interval — confidence limits for the arithmetic mean of lognormal data (e.g. a concentration
 * compared with an action level), from the uniformly most powerful unbiased test of θ = μ + σ²/2.
 *
 * Source: Land CE (1971) Confidence intervals for linear functions of the normal mean and variance, Annals
 * of Mathematical Statistics 42:1187–1205; tables in Land (1975) Selected Tables in Mathematical Statistics
 * III:385–419 (subset in Gilbert 1987, Table A10, "H"). UCL₁₋α = exp(ȳ + s_y²/2 + s_y·H₁₋α/√(n−1)), LCL with H_α.
 * Computation: with y' = ln x − θ₀ and R² = Σy'², the test conditions on R; on the sphere of radius R the
 * statistic U = Σy'/(√n·R) has density ∝ (1 − u²)^{(n−3)/2}·exp(−√n·R·u/2) under θ = θ₀. With u = sin φ the
 * cdf is a ratio of two 1-D integrals of cos^{n−2}φ·exp(−a·sin φ), a = √n·R/2, done here by Gauss–Legendre
 * quadrature on a window around the mode (exponent shifted by its maximum, so stable for large s_y);
 * H is the root of P(U ≤ u_obs; θ₀) = 1 − p (Brent's method from the large-sample value). No hand-typed table.
 * Preconditions: n ≥ 2 positive values (logMean, logSd of ln x), 0 < level < 1.
 * Returns: estimate exp(ȳ + s²/2), lower, upper (0 / +∞ on the open side of a one-sided bound), and H.
 * Validity: exact for lognormal data; grows very large for large s_y and small n (USEPA 2002 warns the
 * H-UCL "explodes" there) — the method is right only if the data really are lognormal.
 * @example landH(10, 1, 0.95) // 3.1026
 */
import type { Sided } from '../model/types.ts';
import { normalQuantile } from './distributions.ts';

// 20-point Gauss–Legendre nodes and weights on [−1, 1] (Abramowitz & Stegun 1964, Table 25.4).
const GL_X = [
  0.0765265211334973, 0.2277858511416451, 0.3737060887154195, 0.5108670019508271, 0.636053680726515,
  0.7463319064601508, 0.8391169718222188, 0.9122344282513259, 0.9639719272779138, 0.9931285991850949,
];
const GL_W = [
  0.1527533871307258, 0.1491729864726037, 0.1420961093183821, 0.1316886384491766, 0.1181945319615184,
  0.1019301198172404, 0.0832767415767048, 0.0626720483341091, 0.0406014298003869, 0.0176140071391521,
];
/** At most this many 20-point panels per integral; a panel spans at most two widths of the mode's peak. */
const PANELS = 24;
const HALF_PI = Math.PI / 2;
/** The window ends where the integrand is below e^−60 of its peak (1e-26: nothing left to add). */
const NEGLIGIBLE = -60;

/** ∫ exp(g(φ) − gMax) dφ over [lo, hi] by composite 20-point Gauss–Legendre, panels of at most `panel`. */
function integrate(g: (phi: number) => number, gMax: number, lo: number, hi: number, panel: number): number {
  if (!(hi > lo)) return 0;
  const panels = Math.min(PANELS, Math.max(2, Math.ceil((hi - lo) / panel)));
  const h = (hi - lo) / panels;
  let sum = 0;
  for (let k = 0; k < panels; k++) {
    const mid = lo + (k + 0.5) * h;
    const half = h / 2;
    for (let i = 0; i < 10; i++) {
      const dx = half * GL_X[i]!;
      sum += GL_W[i]! * (Math.exp(g(mid - dx) - gMax) + Math.exp(g(mid + dx) - gMax)) * half;
    }
  }
  return sum;
}

/** P(U ≤ uObs) for the conditional density ∝ (1 − u²)^{(n−3)/2}·exp(−a·u) on (−1, 1). */
function conditionalCdf(n: number, a: number, uObs: number): number {
  if (uObs <= -1) return 0;
  if (uObs >= 1) return 1;
  const m = n - 2;
  const g = (phi: number): number => {
    const c = Math.cos(phi);
    return (m === 0 ? 0 : m * Math.log(Math.max(c, 1e-300))) - a * Math.sin(phi);
  };
  // mode: a·s² − m·s − a = 0, root in [−1, 0] (s = sin φ)
  const sMode = a === 0 ? 0 : (m - Math.sqrt(m * m + 4 * a * a)) / (2 * a);
  const phiMode = Math.asin(Math.max(-1, Math.min(1, sMode)));
  const c = Math.cos(phiMode);
  const curvature = (m > 0 ? m / (c * c) : 0) - a * Math.sin(phiMode);
  const width = 1 / Math.sqrt(Math.max(curvature, 1e-12));
  const gMax = g(phiMode);
  // the window: at most 40 widths either side of the mode, cut where the integrand has become negligible
  let lo = Math.max(-HALF_PI, phiMode - 40 * width);
  let hi = Math.min(HALF_PI, phiMode + 40 * width);
  for (let k = 4; k < 40; k += 2)
    if (phiMode - k * width > lo && g(phiMode - k * width) - gMax < NEGLIGIBLE) {
      lo = phiMode - k * width;
      break;
    }
  for (let k = 4; k < 40; k += 2)
    if (phiMode + k * width < hi && g(phiMode + k * width) - gMax < NEGLIGIBLE) {
      hi = phiMode + k * width;
      break;
    }
  const panel = 2 * width;
  const phiObs = Math.asin(uObs);
  if (phiObs <= lo) return 0;
  if (phiObs >= hi) return 1;
  const total = integrate(g, gMax, lo, hi, panel);
  // integrate the smaller side for accuracy
  if (phiObs < phiMode) return integrate(g, gMax, lo, phiObs, panel) / total;
  return 1 - integrate(g, gMax, phiObs, hi, panel) / total;
}

/** P(U ≤ u_obs) for the standardised sample (ȳ = 0, s_y = s) at the candidate factor H. */
function tailAt(n: number, s: number, h: number): number {
  const theta0 = (s * s) / 2 + (s * h) / Math.sqrt(n - 1);
  const r = Math.sqrt((n - 1) * s * s + n * theta0 * theta0);
  const uObs = (-Math.sqrt(n) * theta0) / r;
  return conditionalCdf(n, (Math.sqrt(n) * r) / 2, uObs);
}

const cache = new Map<string, number>();
/** Land factors solved so far (cache misses), for tests that count the per-entry path's cost. */
let solves = 0;
export function landHSolves(): number {
  return solves;
}

/**
 * Root of a decreasing f on [lo, hi] (f(lo) > 0 > f(hi)) by Brent's method (Brent RP 1973, Algorithms for
 * Minimization without Derivatives, ch. 4, "zero"): inverse quadratic interpolation with bisection as the
 * fallback, so never slower than bisection and usually 6–8 evaluations instead of 35.
 */
function brentRoot(f: (h: number) => number, lo: number, hi: number, flo: number, fhi: number): number {
  let a = lo;
  let b = hi;
  let fa = flo;
  let fb = fhi;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let i = 0; i < 200; i++) {
    if ((fb > 0 && fc > 0) || (fb < 0 && fc < 0)) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    // the bisection's stopping width: 1e-10 of |H| (at least 1e-10)
    const tol = 0.5e-10 * Math.max(1, Math.abs(b));
    const m = (c - b) / 2;
    if (Math.abs(m) <= tol || fb === 0) return b;
    if (Math.abs(e) >= tol && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = d;
      }
    } else {
      d = m;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol ? d : m > 0 ? tol : -tol;
    fb = f(b);
  }
  return b;
}

/** Land's factor H_p(n, s_y): the p-level limit is exp(ȳ + s_y²/2 + s_y·H_p/√(n−1)). */
export function landH(n: number, sy: number, p: number): number {
  if (!(Number.isInteger(n) && n >= 2)) throw new RangeError('landH requires an integer n >= 2');
  if (!(sy > 0) || !Number.isFinite(sy)) throw new RangeError('landH requires s_y > 0');
  if (!(p > 0 && p < 1)) throw new RangeError('landH requires 0 < p < 1');
  const key = `${n}|${sy}|${p}`;
  const hit = cache.get(key);
  if (hit !== undefined) return hit;
  solves++;
  const target = 1 - p; // tailAt decreases in H
  const f = (h: number): number => tailAt(n, sy, h) - target;
  // Start from the large-sample value (the Cox standard error of ȳ + s²/2: H ≈ z_p·√((n−1)/n + s²/2)) and
  // widen a step at a time until the root is bracketed.
  const z = normalQuantile(p);
  const guess = z * Math.sqrt((n - 1) / n + (sy * sy) / 2);
  let step = 0.05 * Math.max(1, Math.abs(guess));
  let lo = guess;
  let flo = f(lo);
  let hi = guess;
  let fhi = flo;
  if (flo > 0) {
    do {
      lo = hi;
      flo = fhi;
      hi = lo + step;
      fhi = f(hi);
      step *= 2;
      if (hi > 1e9) throw new RangeError('landH did not bracket the root');
    } while (fhi > 0);
  } else {
    do {
      hi = lo;
      fhi = flo;
      lo = hi - step;
      flo = f(lo);
      step *= 2;
      if (lo < -1e9) throw new RangeError('landH did not bracket the root');
    } while (flo < 0);
  }
  const h = flo === 0 ? lo : fhi === 0 ? hi : brentRoot(f, lo, hi, flo, fhi);
  if (cache.size > 10_000) cache.clear();
  cache.set(key, h);
  return h;
}

export function landInterval(
  stats: { n: number; logMean: number; logSd: number },
  level: number,
  sided: Sided,
): { estimate: number; lower: number; upper: number; hLower: number | null; hUpper: number | null } {
  const { n, logMean, logSd: s } = stats;
  if (!(n >= 2)) throw new RangeError('landInterval requires n >= 2');
  if (!(level > 0 && level < 1)) throw new RangeError('landInterval requires 0 < level < 1');
  const centre = logMean + (s * s) / 2;
  const estimate = Math.exp(centre);
  if (!(s > 0)) return { estimate, lower: estimate, upper: estimate, hLower: null, hUpper: null };
  const alpha = 1 - level;
  const pUpper = sided === 'two' ? 1 - alpha / 2 : level;
  const pLower = sided === 'two' ? alpha / 2 : alpha;
  const hUpper = sided === 'lower' ? null : landH(n, s, pUpper);
  const hLower = sided === 'upper' ? null : landH(n, s, pLower);
  const k = s / Math.sqrt(n - 1);
  return {
    estimate,
    lower: hLower === null ? 0 : Math.exp(centre + k * hLower),
    upper: hUpper === null ? Number.POSITIVE_INFINITY : Math.exp(centre + k * hUpper),
    hLower,
    hUpper,
  };
}
