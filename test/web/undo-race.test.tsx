// @vitest-environment happy-dom
// "Undo last" right after a save withdraws that save, even when the save's statistics are still waiting
// for the next frame (the tap path shows "Saved #k" first and recomputes after the frame). Storage is
// fake-indexeddb, an in-memory implementation of the W3C Indexed Database API; values are ZARR13
// (NIST/SEMATECH e-Handbook heat flow meter data).
import 'fake-indexeddb/auto';
import { renderHook, waitFor } from '@testing-library/preact';
import { IDBFactory } from 'fake-indexeddb';
import { beforeAll, beforeEach, expect, it } from 'vitest';
import type { StudySetup } from '../../src/index.ts';
import { loadCore } from '../../web/core-loader.ts';
import { useStudy } from '../../web/state/use-study.ts';
import { resetDbForTests } from '../../web/storage/db.ts';
import { listObservations } from '../../web/storage/observations.ts';
import { createStudy } from '../../web/storage/studies.ts';
import zarr13 from '../fixtures/stats-zarr13.json';

const heat = zarr13.values as number[];
const setup: StudySetup = {
  kind: 'measurement',
  unit: 'W/m2K',
  level: 0.95,
  sided: 'two',
  rule: 'standard',
  min: 10,
};

beforeAll(async () => {
  await loadCore();
});
beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});

it('undo straight after a save voids that save, not the one before it', async () => {
  const study = await createStudy({ name: 'Undo race', setup }, 'phone-A');
  const { result } = renderHook(() => useStudy(study.id));
  await waitFor(() => expect(result.current.loaded).toBe(true));
  await result.current.add({ value: heat[0]! });
  const second = await result.current.add({ value: heat[1]! });
  // no wait for `second.applied`: the tap on Undo can come before the next frame
  const undone = await result.current.undoLast('entered twice');
  expect(undone.record.voids).toBe(second.record.id);
  const log = await listObservations(study.id);
  expect(log.map((r) => r.voids ?? r.value)).toEqual([heat[0], heat[1], second.record.id]);
});
