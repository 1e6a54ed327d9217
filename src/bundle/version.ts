/**
 * Bundle format versions: a bundle from a newer version of the program is refused with a message naming
 * both versions (its members may mean things this program does not know); a bundle from an older version
 * is upgraded, one version at a time, before it is validated as the current format.
 *
 * Version 1 is the first format, so today no older bundle exists and `UPGRADES` is empty: a version-1
 * bundle is read as it is. When version 2 is introduced, `UPGRADES[1]` turns a version-1 bundle into a
 * version-2 one (src/bundle/SCHEMA.md, "Changing the format"). The mechanism is tested with injected
 * steps (test/core/bundle/version.test.ts), not with an invented old format.
 *
 * The checksum of an older bundle is checked against its own content before any step runs (every version
 * so far hashes the canonical JSON of `{study, events}`), and recomputed over the upgraded content, so an
 * upgrade never hides damage and never produces a bundle that fails its own checksum.
 */

import type { ObservationRecord, StudyRecord } from '../model/records.ts';
import { BUNDLE_VERSION, bundleChecksum } from './bundle.ts';

type Obj = Record<string, unknown>;

/** Turns a bundle object of version v into one of version v + 1 (study and events; the caller sets the rest). */
export type UpgradeStep = (bundle: { study: unknown; events: unknown }) => {
  study: unknown;
  events: unknown;
};

/** The upgrade from each older version to the next. Empty: version 1 is the first format. */
export const UPGRADES: Readonly<Record<number, UpgradeStep>> = {};

export type VersionResult =
  | { ok: true; data: Obj; upgradedFrom: number | null }
  | { ok: false; problem: string };

const show = (v: unknown) =>
  typeof v === 'string' ? `"${v.slice(0, 40)}"` : (JSON.stringify(v) ?? String(v));

/**
 * Checks `data.version` and upgrades an older bundle to `current`. `steps` and `current` are for tests;
 * the program uses UPGRADES and BUNDLE_VERSION.
 */
export async function upgradeBundle(
  data: Obj,
  steps: Readonly<Record<number, UpgradeStep>> = UPGRADES,
  current: number = BUNDLE_VERSION,
): Promise<VersionResult> {
  const v = data.version;
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 1)
    return {
      ok: false,
      problem: `version: must be a whole number ≥ 1 (the bundle format version), got ${show(v)}`,
    };
  if (v > current)
    return {
      ok: false,
      problem: `version: this file is bundle format version ${v}, made by a newer version of Sure Enough; this program reads bundle format version ${current} and older. Update the program to read it.`,
    };
  if (v === current) return { ok: true, data, upgradedFrom: null };
  const checksum = data.checksum as Obj | undefined;
  let own: string | null = null;
  try {
    own = await bundleChecksum(data.study as StudyRecord, data.events as ObservationRecord[]);
  } catch {
    // content that has no canonical JSON (a non-finite number) cannot match any checksum
  }
  if (own === null || checksum?.value !== own)
    return {
      ok: false,
      problem: `checksum.value: does not match the content of this version ${v} bundle: the file was changed or damaged after export, so it is not upgraded`,
    };
  let body = { study: data.study, events: data.events };
  for (let from = v; from < current; from++) {
    const step = steps[from];
    if (step === undefined)
      return { ok: false, problem: `version: no upgrade from bundle format version ${from} to ${from + 1}` };
    body = step(body);
  }
  const value = await bundleChecksum(body.study as StudyRecord, body.events as ObservationRecord[]);
  return {
    ok: true,
    data: { ...data, version: current, ...body, checksum: { algorithm: 'SHA-256', value } },
    upgradedFrom: v,
  };
}
