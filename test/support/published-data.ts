/**
 * Published data sets, shaped as entries, shared by the tests that run whole studies through the app's
 * surfaces (test/surfaces, test/core/assess/snapshot.test.ts). Not a test file. What the published figures
 * say about each estimator is checked in test/core; here the data only have to be real, not invented.
 */
import type { Point } from '../../src/model/types.ts';
import cluster from '../fixtures/design-cluster.json';
import km from '../fixtures/design-kaplan-meier.json';
import stratified from '../fixtures/design-stratified.json';
import zarr13 from '../fixtures/stats-zarr13.json';

/** ZARR13: NIST/SEMATECH e-Handbook heat flow meter calibration data, 195 values (stats-zarr13.json). */
export const heat: readonly number[] = zarr13.values as number[];

/**
 * Bortkiewicz (1898) deaths by horse kick per Prussian army corps and year: frequencies 109/65/22/3/1 for
 * 0–4 deaths (from memory). The order within the 200 corps-years is not published, so one is fixed here.
 */
export const kicks: readonly number[] = (() => {
  const left = [109, 65, 22, 3, 1];
  const out: number[] = [];
  for (let i = 0; out.length < 200; i++) {
    const k = [0, 1, 0, 2, 0, 1, 0, 1, 3, 0, 1, 2, 0, 4, 1, 0][i % 16] as number;
    const pick = (left[k] as number) > 0 ? k : left.findIndex((x) => x > 0);
    (left[pick] as number)--;
    out.push(pick);
  }
  return out;
})();

/**
 * USEPA (2009) Unified Guidance Example 15-1, ln(manganese): the detects, with the reporting limits of the
 * non-detects spread through the log (the order of the results is not published).
 */
export const nonDetectEntries: readonly Point[] = (() => {
  const out: Point[] = (km.published.detects as number[]).map((value) => ({ value }));
  (km.published.limits as number[]).forEach((value, i) => {
    out.splice(2 + 4 * i, 0, { value, censored: true });
  });
  return out;
})();

/** Scheaffer, Mendenhall & Ott, Elementary Survey Sampling, Example 5.1: three strata (design-stratified.json). */
export const strata = stratified.strata;
export const strataEntries: readonly Point[] = stratified.strata.flatMap((s) =>
  s.values.map((value) => ({ value, stratum: s.name })),
);

/** Scheaffer et al. Example 8.1: each primary unit's published total spread evenly over its entries. */
export const unitEntries: readonly Point[] = cluster.clusters.flatMap((c, i) =>
  Array.from({ length: c.size }, () => ({ value: c.total / c.size, cluster: `block ${i + 1}` })),
);

/** The detects of USEPA 2009 Ex. 15-1 (for a correction's value). */
export const firstDetect = km.published.detects[0] as number;
