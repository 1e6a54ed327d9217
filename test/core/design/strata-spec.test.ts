// The strata text syntax shared by the CLI (--strata, --cost) and the setup form. A parser: checked by
// round trip and by the problems it must name (no external reference applies).
import { describe, expect, it } from 'vitest';
import { formatStrata, parseStrata } from '../../../src/design/strata-spec.ts';

describe('parseStrata', () => {
  it('reads name:weight pairs and optional costs', () => {
    expect(parseStrata('woodland:0.6, meadow:0.4', 'meadow:3')).toEqual({
      ok: true,
      strata: [
        { name: 'woodland', weight: 0.6 },
        { name: 'meadow', weight: 0.4, cost: 3 },
      ],
    });
  });
  it('accepts a decimal comma with ; between strata, and names with spaces', () => {
    expect(parseStrata('wet meadow:0,25; dry meadow:0,75')).toEqual({
      ok: true,
      strata: [
        { name: 'wet meadow', weight: 0.25 },
        { name: 'dry meadow', weight: 0.75 },
      ],
    });
  });
  it('names the problem', () => {
    expect(parseStrata('woodland')).toMatchObject({
      ok: false,
      problem: expect.stringMatching(/name:weight/),
    });
    expect(parseStrata('a:x')).toMatchObject({
      ok: false,
      problem: expect.stringMatching(/must be a number/),
    });
    expect(parseStrata('a:1', 'a:y')).toMatchObject({
      ok: false,
      problem: expect.stringMatching(/must be a number/),
    });
  });
  it('reads what is well written and leaves its validity to the setup validator (src/model/setup.ts)', () => {
    // a repeated name and a weight of 0 are read as written; the validator refuses them in its own words
    expect(parseStrata('a:1,a:2')).toMatchObject({ ok: true, strata: [{ name: 'a' }, { name: 'a' }] });
    expect(parseStrata('a:0,b:-1')).toMatchObject({ ok: true, strata: [{ weight: 0 }, { weight: -1 }] });
    expect(parseStrata('')).toMatchObject({ ok: false, problem: 'no strata given' });
    expect(parseStrata('a:1', 'b:2')).toMatchObject({
      ok: false,
      problem: expect.stringMatching(/no stratum/),
    });
  });
  it('round-trips through formatStrata', () => {
    const r = parseStrata('a:2,b:3', 'a:1,b:4');
    if (!r.ok) throw new Error(r.problem);
    const f = formatStrata(r.strata);
    expect(parseStrata(f.strata, f.costs)).toEqual(r);
  });
});
