/**
 * The crew view equals `merge` + `assess` on the same events (issue 16): the phones' logs are written as
 * bundles, pooled by mergeBundles (what `sure-enough merge` runs) and assessed as `sure-enough assess` reads
 * a bundle (pointsOf, then assess); crewView over the union of the same events must give the same figures,
 * object for object. The data are published (test/support/published-data.ts): NIST/SEMATECH ZARR13 heat
 * flow readings and Scheaffer, Mendenhall & Ott Example 5.1 (three strata), dealt out to three phones.
 * Evidence level: agreement between two surfaces of the project on published data (the surfaces' own
 * figures are checked against references in test/core and test/surfaces).
 */
import { describe, expect, it } from 'vitest';
import { pooledOrder } from '../../../src/bundle/pooled-order.ts';
import type { ObservationRecord, StudyRecord } from '../../../src/model/records.ts';
import { crewView } from '../../../src/sync/crew-view.ts';
import { mergedAssessment, mergedBundle } from '../../support/merged.ts';
import { heat, strata, strataEntries } from '../../support/published-data.ts';
import { study, uuid } from '../bundle/make.ts';

/** One phone's log: its entries in its own seq order, its clock `clockShiftDays` off. */
function phoneLog(
  st: StudyRecord,
  device: string,
  tag: number,
  points: readonly { value: number; stratum?: string }[],
  clockShiftDays: number,
): ObservationRecord[] {
  const start = Date.parse('2026-05-04T07:00:00Z') + clockShiftDays * 86_400_000;
  return points.map((p, i) => ({
    id: uuid(tag, i + 1),
    studyId: st.id,
    seq: i + 1,
    at: new Date(start + i * 97_000).toISOString().replace('Z', '+00:00'),
    value: p.value,
    device,
    ...(p.stratum === undefined ? {} : { stratum: p.stratum }),
  }));
}

/** Deals points out to phones in an uneven pattern (A twice, then B, then C…). */
function deal<T>(points: readonly T[]): [T[], T[], T[]] {
  const out: [T[], T[], T[]] = [[], [], []];
  const pattern = [0, 0, 1, 2, 1, 0, 2];
  for (const [i, p] of points.entries()) out[pattern[i % pattern.length]!]!.push(p);
  return out;
}

function heatCrew(shiftB: number) {
  const st = study({
    kind: 'measurement',
    unit: 'W/(m2.K)',
    plotArea: undefined,
    plotAreaUnit: undefined,
    taxon: undefined,
    target: { kind: 'margin', value: 0.01 },
    min: 10,
  });
  const [a, b, c] = deal(heat.map((value) => ({ value })));
  const A = phoneLog(st, 'phone-A', 10, a, 0);
  const B = phoneLog(st, 'phone-B', 11, b, shiftB);
  const C = phoneLog(st, 'phone-C', 12, c, 0);
  // phone C withdraws one of A's entries (a typo seen on A's screen): a void is an event of C's own log
  C.push({
    id: uuid(12, 900),
    studyId: st.id,
    seq: C.length + 1,
    at: C.at(-1)!.at,
    device: 'phone-C',
    voids: A[3]!.id,
    reason: 'typo',
  });
  return { st, logs: [A, B, C] };
}

describe('crew view = merge + assess', () => {
  it('heat flow readings on three phones, one clock a year behind, one void across phones', async () => {
    const { st, logs } = heatCrew(-365);
    const view = crewView(st, logs.flat());
    expect(view.assessment).toEqual(await mergedAssessment(st, logs));
    expect(view.n).toBe(heat.length - 1);
    expect(view.phones.map((p) => [p.device, p.counted])).toEqual([
      ['phone-A', logs[0]!.length - 1],
      ['phone-B', logs[1]!.length],
      ['phone-C', logs[2]!.length - 1],
    ]);
  });

  it('the same whatever order the events arrive in, and whatever the clocks say', async () => {
    const { st, logs } = heatCrew(0);
    const shifted = heatCrew(3650);
    const base = crewView(st, logs.flat());
    expect(crewView(st, [...logs.flat()].reverse())).toEqual(base);
    expect(crewView(st, shifted.logs.flat()).assessment).toEqual(base.assessment);
  });

  it('stratified (Scheaffer et al. Example 5.1): the same estimate, strata progress and where next', async () => {
    const st = study({
      kind: 'measurement',
      unit: '1',
      plotArea: undefined,
      plotAreaUnit: undefined,
      taxon: undefined,
      target: { kind: 'margin', value: 1 },
      min: 2,
      strata: strata.map((s) => ({ name: s.name, weight: s.population, population: s.population })),
    });
    const [a, b, c] = deal(strataEntries);
    const logs = [
      phoneLog(st, 'phone-A', 20, a, 0),
      phoneLog(st, 'phone-B', 21, b, 2),
      phoneLog(st, 'phone-C', 22, c, -1),
    ];
    const view = crewView(st, logs.flat());
    const merged = await mergedAssessment(st, logs);
    expect(view.assessment).toEqual(merged);
    expect(view.strata.map((s) => [s.name, s.n])).toEqual(strata.map((s) => [s.name, s.values.length]));
    expect(view.assessment?.details.whereNext).toBeDefined();
  });

  it('reads the events in the order merge writes them (sequential rules read the order)', async () => {
    const { st, logs } = heatCrew(-365);
    const bundle = await mergedBundle(st, logs);
    const ids = pooledOrder(logs.flat()).map((e) => e.id);
    expect(bundle.events.map((e) => e.id)).toEqual(ids);
    // the clock-free order differs from the clocks' order here (B's clock is a year behind)
    const byClock = [...logs.flat()].sort((x, y) => Date.parse(x.at) - Date.parse(y.at)).map((e) => e.id);
    expect(byClock).not.toEqual(ids);
  });

  it('no counted entry yet: no assessment, the phones still listed', () => {
    const { st } = heatCrew(0);
    const view = crewView(st, []);
    expect(view).toEqual({ assessment: null, n: 0, phones: [], strata: [] });
  });
});
