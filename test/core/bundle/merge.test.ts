/**
 * Merge: set union by UUID (G-Set, Shapiro et al. 2011 §3.3.1), idempotent, deterministic order,
 * refusals, duplicate flags and collector shares. Expected counts below are derived by hand from the
 * constructed logs (evidence: derived).
 */
import { describe, expect, it } from 'vitest';
import { makeBundle, serializeBundle } from '../../../src/bundle/bundle.ts';
import { pointsOf } from '../../../src/bundle/events.ts';
import { mergeBundles } from '../../../src/bundle/merge.ts';
import { parseBundle } from '../../../src/bundle/validate.ts';
import { entries, study, uuid, voidOf } from './make.ts';

const st = study();
const a = entries(st, [3, 0, 5, 2], 'phone-A', 2, 0, (i) => ({ label: `Q${i + 1}` }));
a.push(voidOf(st, a[1]!, 5, uuid(3, 1)));
// phone B: interleaved in time (starts 30 s later), labels Q3 (clash with A) and Q11, Q12.
const bRaw = entries(st, [4, 1, 6], 'phone-B', 4, 0, (i) => ({ label: ['Q3', 'Q11', 'Q12'][i]! }));
const b = bRaw.map((e) => ({ ...e, at: e.at.replace(':00+', ':20+') }));
const A = await makeBundle(st, a);
const B = await makeBundle(st, b);

async function merged(x = A, y = B) {
  const r = await mergeBundles(x, y);
  if (!r.ok) throw new Error(r.message);
  return r;
}

describe('mergeBundles', () => {
  it('union by id, re-sequenced in the pooled order (each phone its own order, interleaved); result validates', async () => {
    const r = await merged();
    expect(r.report.added).toBe(3);
    expect(r.report.alreadyPresent).toBe(0);
    const ev = r.bundle.events;
    expect(ev.map((e) => e.seq)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    // A's log: Q1 Q2 Q3 Q4 void (seq 1–5); B's: Q3 Q11 Q12 (seq 1–3). By rank, A before B within a rank.
    expect(ev.map((e) => `${e.device}:${e.label ?? 'void'}`)).toEqual([
      'phone-A:Q1',
      'phone-B:Q3',
      'phone-A:Q2',
      'phone-B:Q11',
      'phone-A:Q3',
      'phone-B:Q12',
      'phone-A:Q4',
      'phone-A:void',
    ]);
    const check = await parseBundle(serializeBundle(r.bundle));
    expect(check.ok).toBe(true);
  });
  it('never by clock: a phone whose clock is a year behind keeps its place; pooling the pooled log again keeps the order', async () => {
    const late = await makeBundle(
      st,
      b.map((e) => ({ ...e, at: e.at.replace(/^(\d{4})/, (y) => String(Number(y) - 1)) })),
    );
    const order = (events: readonly { device: string; label?: string }[]) =>
      events.map((e) => `${e.device}:${e.label ?? 'void'}`);
    const once = await merged();
    expect(order((await merged(A, late)).bundle.events)).toEqual(order(once.bundle.events));
    expect(order((await merged(late, A)).bundle.events)).toEqual(order(once.bundle.events));
    // a third phone pooled into the already-merged log: A and B keep their interleaving
    const c = await makeBundle(
      st,
      entries(st, [7], 'phone-C', 9, 0, () => ({ label: 'Q20' })),
    );
    const again = order((await merged(once.bundle, c)).bundle.events);
    expect(again.filter((x) => !x.startsWith('phone-C'))).toEqual(order(once.bundle.events));
    expect(again.indexOf('phone-C:Q20')).toBe(2);
  });
  it('counted values are the union of both phones (voided entry left out)', async () => {
    const values = pointsOf((await merged()).bundle.events).map((p) => p.value);
    expect([...values].sort()).toEqual([1, 2, 3, 4, 5, 6]);
  });
  it('the same bundle twice changes nothing', async () => {
    const once = (await merged()).bundle;
    const twice = await mergeBundles(once, B);
    expect(twice.ok).toBe(true);
    if (twice.ok) {
      expect(twice.report.added).toBe(0);
      expect(twice.report.alreadyPresent).toBe(3);
      expect(twice.bundle).toBe(once);
    }
    const self = await mergeBundles(A, A);
    expect(self.ok && self.bundle).toBe(A);
  });
  it('order of pooling does not matter (A+B equals B+A)', async () => {
    expect(serializeBundle((await merged(A, B)).bundle)).toBe(serializeBundle((await merged(B, A)).bundle));
  });
  it('refuses a different study', async () => {
    const other = study({}, { id: uuid(7, 0), name: 'Other meadow' });
    const r = await mergeBundles(A, await makeBundle(other, entries(other, [1], 'phone-C', 6)));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^refused: different studies \("Sedge plots, north meadow"/);
  });
  it('refuses the same study with a different setup, naming the difference', async () => {
    const changed = study({ level: 0.9 });
    const r = await mergeBundles(A, await makeBundle(changed, entries(changed, [1], 'phone-C', 6)));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain('level: 0.95 vs 0.9');
  });
  it('refuses an event whose content differs between the bundles', async () => {
    const altered = await makeBundle(
      st,
      a.map((e, i) => (i === 2 ? { ...e, value: 50 } : e)),
    );
    const r = await mergeBundles(A, altered);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain(a[2]!.id);
  });
  it('flags likely duplicates (same label, two devices), keeps both', async () => {
    const r = await merged();
    expect(r.report.duplicates).toEqual([
      { label: 'Q3', ids: [b[0]!.id, a[2]!.id], devices: ['phone-A', 'phone-B'] },
    ]);
    expect(pointsOf(r.bundle.events)).toHaveLength(6);
  });
  it('a voided entry with a clashing label is not a duplicate; same label in other strata is not either', async () => {
    const s2 = entries(st, [1, 1], 'phone-C', 8, 10, (i) => ({
      label: 'Q1',
      stratum: i === 0 ? 'wet' : 'dry',
    }));
    const r = await merged(A, await makeBundle(st, s2));
    expect(r.report.duplicates).toEqual([]);
  });
  it("reports each collector's share of counted entries", async () => {
    expect((await merged()).report.shares).toEqual([
      { device: 'phone-A', entries: 4, counted: 3, voids: 1, share: 0.5 },
      { device: 'phone-B', entries: 3, counted: 3, voids: 0, share: 0.5 },
    ]);
  });
});

describe('mergeBundles — study records that differ outside the setup', () => {
  it('keeps the record created first, whichever bundle comes first, and names the differences', async () => {
    const later = { ...st, name: 'Sedge plots (desk copy)', createdAt: '2026-05-04T10:00:00+02:00' };
    const C = await makeBundle(later, b);
    const r1 = await mergeBundles(A, C);
    const r2 = await mergeBundles(C, A);
    expect(r1.ok && r2.ok).toBe(true);
    if (!r1.ok || !r2.ok) return;
    expect(r1.bundle.study.name).toBe('Sedge plots, north meadow');
    expect(serializeBundle(r1.bundle)).toBe(serializeBundle(r2.bundle));
    expect(r1.report.studyDiffers).toEqual(['createdAt', 'name']);
  });
});
