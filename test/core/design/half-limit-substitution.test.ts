// Half-limit substitution (Helsel 2012 ch. 1 describes it; offered only as an explicit option). Checked by
// hand: values 0.5 (= 1/2), 2, 3 → mean 11/6, SD √((1/3² + … )) computed with numpy below.
// python3 -c "import numpy as np; x=np.array([0.5,2,3]); print(x.mean(), x.std(ddof=1))"
// → 1.8333333333333333 1.2583057392117916
import { describe, expect, it } from 'vitest';
import { halfLimitSubstitution } from '../../../src/design/half-limit-substitution.ts';

describe('halfLimitSubstitution', () => {
  it('replaces each non-detect by half its limit', () => {
    const r = halfLimitSubstitution([{ value: 1, censored: true }, { value: 2 }, { value: 3 }]);
    if (r.status !== 'ok') throw new Error('expected ok');
    expect(r.mean).toBeCloseTo(1.8333333333333333, 14);
    expect(r.sd).toBeCloseTo(1.2583057392117916, 14);
    expect(r.substituted).toBe(1);
  });
  it('too few points, and bad values', () => {
    expect(halfLimitSubstitution([{ value: 1 }]).status).toBe('too-few');
    expect(() => halfLimitSubstitution([{ value: Number.POSITIVE_INFINITY }])).toThrow(RangeError);
  });
});
