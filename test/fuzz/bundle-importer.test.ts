/**
 * Property-based fuzzing of the study-bundle importer (parseBundle, src/bundle/validate.ts), fast-check
 * 4.10.2. The bundle format is src/bundle/SCHEMA.md; its rules are what is checked here.
 *
 * Claims:
 * - every generated well-formed bundle is accepted and reads back exactly (the baseline the faults are
 *   planted in);
 * - a planted fault — a required member removed, a member of the wrong type or out of range, an unknown
 *   member (including `__proto__`), events out of order, a value changed after export (checksum), the
 *   file cut short, arbitrary JSON or text — is refused (never a partial bundle), never throws, and
 *   every message reads `where: what`; for faults planted at a known place, a message names that place
 *   (≥ 1,000 generated malformed inputs in all);
 * - one character inserted, deleted or replaced anywhere in the file is either refused with messages or
 *   read back as exactly the same bundle (whitespace): nothing is ever silently changed;
 * - nothing pollutes Object.prototype.
 * Evidence level: derived (each expected path is where the generator planted the fault).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseBundle } from '../../src/bundle/validate.ts';
import { expectClearProblems, faultArb, goodBundle } from './bundle-arbitraries.ts';

describe('study-bundle importer under fuzzing (fast-check)', () => {
  it('accepts every generated well-formed bundle and reads it back exactly', async () => {
    await fc.assert(
      fc.asyncProperty(goodBundle, async (b) => {
        const r = await parseBundle(JSON.stringify(b, null, 2));
        if (!r.ok) throw new Error(r.problems.join('\n'));
        expect(r.bundle).toEqual(b);
      }),
      { numRuns: 200 },
    );
  });

  it('refuses every planted fault with where: what messages naming the place (1,200 generated inputs)', async () => {
    const seen = new Map<string, number>();
    await fc.assert(
      fc.asyncProperty(faultArb, async (f) => {
        const kind = f.label.split(' ')[0]!;
        seen.set(kind, (seen.get(kind) ?? 0) + 1);
        let r: Awaited<ReturnType<typeof parseBundle>>;
        try {
          r = await parseBundle(f.file);
        } catch (err) {
          throw new Error(`${f.label}: threw ${String(err)}`);
        }
        expect(r.ok, `${f.label} accepted`).toBe(false);
        if (r.ok) return;
        expectClearProblems(r.problems);
        if (f.path !== undefined) {
          const path = f.path;
          expect(
            r.problems.some((p) => p.startsWith(`${path}: `) || p.startsWith(`${path}.`)),
            `${f.label}: no message names ${path}:\n${r.problems.join('\n')}`,
          ).toBe(true);
        }
      }),
      { numRuns: 1200 },
    );
    // every sort of fault was exercised
    for (const k of ['wrong', 'missing', 'unknown', 'swapped', 'tampered', 'truncated', 'arbitrary'])
      expect(seen.get(k) ?? 0, k).toBeGreaterThan(20);
    expect(Object.hasOwn(Object.prototype, 'polluted')).toBe(false);
  });

  it('a member given as an object whose own toString is not a function is named, never thrown on', async () => {
    // found by the fuzzing above: the message writer called String() on it, which throws
    const good = fc.sample(goodBundle, { numRuns: 1, seed: 7 })[0]!;
    const file = JSON.stringify({ ...good, study: { ...good.study, id: { toString: 1 } } });
    const r = await parseBundle(file);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems).toContain('study.id: not a lower-case UUID, got an object');
  });

  it('one character inserted, deleted or replaced: refused with messages, or exactly the same bundle', async () => {
    await fc.assert(
      fc.asyncProperty(
        goodBundle,
        fc.nat(),
        fc.constantFrom('insert', 'delete', 'replace'),
        fc.string({ minLength: 1, maxLength: 1, unit: 'binary' }),
        fc.boolean(),
        async (b, k, op, ch, pretty) => {
          const full = pretty ? JSON.stringify(b, null, 2) : JSON.stringify(b);
          const i = k % full.length;
          const damaged =
            op === 'insert'
              ? full.slice(0, i) + ch + full.slice(i)
              : op === 'delete'
                ? full.slice(0, i) + full.slice(i + 1)
                : full.slice(0, i) + ch + full.slice(i + 1);
          const r = await parseBundle(damaged);
          if (r.ok) expect(r.bundle).toEqual(b);
          else expectClearProblems(r.problems);
        },
      ),
      { numRuns: 600 },
    );
  });

  it('a __proto__ member in the file is refused by name and pollutes nothing', async () => {
    await fc.assert(
      fc.asyncProperty(goodBundle, fc.constantFrom('', 'study', 'setup', 'event'), async (b, where) => {
        const full = JSON.stringify(b);
        const evil = '"__proto__":{"polluted":1,"kind":"count"},';
        const file =
          where === ''
            ? full.replace('{', `{${evil}`)
            : where === 'study'
              ? full.replace('"study":{', `"study":{${evil}`)
              : where === 'setup'
                ? full.replace('"setup":{', `"setup":{${evil}`)
                : full.replace('"events":[{', `"events":[{${evil}`);
        const r = await parseBundle(file);
        expect(r.ok).toBe(false);
        if (r.ok) return;
        expect(r.problems.some((p) => p.includes('__proto__: unknown field'))).toBe(true);
        expect(({} as Record<string, unknown>).polluted).toBeUndefined();
      }),
      { numRuns: 100 },
    );
  });
});
