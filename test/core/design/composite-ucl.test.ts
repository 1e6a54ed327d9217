// Replicate-composite UCLs (ITRC ISM-1 §4.3.4.1 formulas) against scipy (test/fixtures/design-composite.json).
import { describe, expect, it } from 'vitest';
import { compositeUcl } from '../../../src/design/composite-ucl.ts';
import fixture from '../../fixtures/design-composite.json';

describe('compositeUcl', () => {
  it.each(fixture.cases)('matches scipy for %#', (c) => {
    const r = compositeUcl(c.results, c.level);
    if (r.status !== 'ok') throw new Error('expected ok');
    const rel = fixture.tolerance.rel;
    expect(Math.abs(r.mean / c.mean - 1)).toBeLessThan(rel);
    expect(Math.abs(r.sd / c.sd - 1)).toBeLessThan(rel);
    expect(Math.abs(r.tUcl / c.tUcl - 1)).toBeLessThan(1e-6);
    expect(Math.abs(r.chebyshevUcl / c.chebyshevUcl - 1)).toBeLessThan(rel);
  });
  it('a single composite gives no bound and says so', () => {
    const r = compositeUcl([42], 0.95);
    expect(r.status).toBe('no-bound');
    expect(r.status === 'no-bound' && r.message).toMatch(/single composite/);
    expect(compositeUcl([], 0.95).status).toBe('no-bound');
  });
  it('a higher level gives a higher bound; Chebyshev above t at 95 % with r = 3', () => {
    const a = compositeUcl([5, 7, 6], 0.9);
    const b = compositeUcl([5, 7, 6], 0.95);
    if (a.status !== 'ok' || b.status !== 'ok') throw new Error('expected ok');
    expect(b.tUcl).toBeGreaterThan(a.tUcl);
    expect(b.chebyshevUcl).toBeGreaterThan(a.chebyshevUcl);
    expect(b.chebyshevUcl).toBeGreaterThan(b.tUcl);
  });
  it('throws on a bad level', () => {
    expect(() => compositeUcl([1, 2, 3], 1)).toThrow(RangeError);
  });
});
