/**
 * Seeded uniform random numbers — xoshiro128** seeded through splitmix32.
 *
 * Question answered: "give me a reproducible stream of uniform numbers from this seed", so that every
 * simulation (coverage benchmark, rule tests) can be re-run exactly and several stopping rules can be fed
 * the same observations (common random numbers).
 *
 * Source: Blackman D, Vigna S (2021) Scaled linear pseudorandom number generators, ACM Trans. Math.
 * Softw. 47(4):36 — the xoshiro128** generator (32-bit state words a, b, c, d; output rotl(b·5, 7)·9).
 * Seeding: splitmix32, the 32-bit variant of Steele, Lea & Flood (2014) SplitMix (OOPSLA '14), so that
 * nearby seeds give unrelated streams and the state is never all zero.
 *
 * Preconditions: seed is any finite number (its low 32 bits and the next 21 bits are used).
 * Returns: an Rng whose `next()` gives a uniform number in the open interval (0, 1) with 32 random bits
 * (never exactly 0, so −ln(u) is always finite), and `nextUint32()` the raw 32-bit output.
 * Validity limits: period 2^128 − 1; not for cryptography.
 *
 * @example
 * const rng = createRng(42);
 * rng.next(); // 0 < u < 1, the same value every run
 */
export interface Rng {
  /** Uniform on (0, 1). */
  next(): number;
  /** Raw 32-bit unsigned output. */
  nextUint32(): number;
}

const TWO_POW_32 = 4294967296;

export function createRng(seed: number): Rng {
  if (!Number.isFinite(seed)) throw new RangeError('createRng requires a finite seed');
  // splitmix32: state advances by the golden-ratio constant, output is mixed.
  let sm = (seed >>> 0) ^ (Math.floor(seed / TWO_POW_32) & 0x1fffff);
  const splitmix = (): number => {
    sm = (sm + 0x9e3779b9) | 0;
    let z = sm;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (z ^ (z >>> 16)) >>> 0;
  };
  let a = splitmix();
  let b = splitmix();
  let c = splitmix();
  let d = splitmix();
  if ((a | b | c | d) === 0) a = 1;
  const nextUint32 = (): number => {
    const r = Math.imul(b, 5);
    const result = Math.imul((r << 7) | (r >>> 25), 9) >>> 0;
    const t = b << 9;
    c ^= a;
    d ^= b;
    b ^= c;
    a ^= d;
    c ^= t;
    d = (d << 11) | (d >>> 21);
    return result;
  };
  return {
    nextUint32,
    next: () => (nextUint32() + 0.5) / TWO_POW_32,
  };
}
