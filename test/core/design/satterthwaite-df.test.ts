// Satterthwaite df against the formula computed with numpy (test/fixtures/design-satterthwaite.json).
import { describe, expect, it } from 'vitest';
import { satterthwaiteDf } from '../../../src/design/satterthwaite-df.ts';
import fixture from '../../fixtures/design-satterthwaite.json';

describe('satterthwaiteDf', () => {
  it.each(fixture.cases)('matches numpy for %#', (c) => {
    const df = satterthwaiteDf(c.components);
    expect(df).not.toBeNull();
    expect(Math.abs(df! / c.df - 1)).toBeLessThan(fixture.tolerance.rel);
  });
  it('lies between the smallest df and the sum of the dfs', () => {
    const comps = [
      { v: 0.2, df: 3 },
      { v: 1.7, df: 12 },
      { v: 0.9, df: 6 },
    ];
    const df = satterthwaiteDf(comps)!;
    expect(df).toBeGreaterThanOrEqual(3);
    expect(df).toBeLessThanOrEqual(21);
  });
  it('returns null when every component is zero; throws on bad input', () => {
    expect(satterthwaiteDf([{ v: 0, df: 4 }])).toBeNull();
    expect(() => satterthwaiteDf([{ v: -1, df: 4 }])).toThrow(RangeError);
    expect(() => satterthwaiteDf([{ v: 1, df: 0 }])).toThrow(RangeError);
  });
});
