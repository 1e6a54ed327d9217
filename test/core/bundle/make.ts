/** Test helpers: deterministic studies and event logs (not a test file). */
import type { ObservationRecord, StudyRecord, StudySetup } from '../../../src/model/records.ts';

/** A deterministic, well-formed lower-case UUID (version 4 layout) from a tag and a number. */
export function uuid(tag: number, n: number): string {
  const h = (tag * 1_000_003 + n).toString(16).padStart(12, '0').slice(-12);
  return `${tag.toString(16).padStart(8, '0')}-0000-4000-8000-${h}`;
}

export function study(setup: Partial<StudySetup> = {}, over: Partial<StudyRecord> = {}): StudyRecord {
  return {
    id: uuid(1, 0),
    name: 'Sedge plots, north meadow',
    createdAt: '2026-05-04T08:00:00+02:00',
    setup: {
      kind: 'count',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      min: 10,
      target: { kind: 'precision', value: 0.2 },
      plotArea: 0.25,
      plotAreaUnit: 'm2',
      unit: '1',
      taxon: 'Carex nigra',
      samplingProtocol: '0.25 m2 quadrats at random points',
      ...setup,
    },
    version: 1,
    ...over,
  };
}

/** Entries with the given values from one device, one minute apart, starting at `start` (+02:00). */
export function entries(
  st: StudyRecord,
  values: readonly number[],
  device: string,
  tag: number,
  startMinute = 0,
  extra: (i: number) => Partial<ObservationRecord> = () => ({}),
): ObservationRecord[] {
  return values.map((value, i) => {
    const m = startMinute + i;
    const at = `2026-05-04T${String(9 + Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}:00+02:00`;
    return { id: uuid(tag, i + 1), studyId: st.id, seq: i + 1, at, value, device, ...extra(i) };
  });
}

export function voidOf(
  st: StudyRecord,
  target: ObservationRecord,
  seq: number,
  id: string,
  reason = 'keyed twice',
): ObservationRecord {
  return {
    id,
    studyId: st.id,
    seq,
    at: target.at.replace(':00+', ':30+'),
    device: target.device,
    voids: target.id,
    reason,
  };
}
