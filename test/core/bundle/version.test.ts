/**
 * Bundle format versions (src/bundle/version.ts, src/bundle/SCHEMA.md "Changing the format"): a newer
 * version is refused naming both versions; the current one is read as it is; an older one is upgraded step
 * by step after its own checksum is checked, and carries a checksum of its new content.
 *
 * Version 1 is the first format, so no older bundle exists: the fixture
 * test/fixtures/bundle-format-v1.bundle.json is the CURRENT format (written by
 * `sure-enough bundle --id 0b5e8f0e-… --at 2026-05-04T09:00:00Z`, see its name), and the upgrade path is
 * exercised with an injected step that treats it as "version 1 of a program whose current version is 2".
 * The new checksum is checked with Node's own SHA-256 (OpenSSL, node:crypto) over the canonical JSON.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { BUNDLE_VERSION } from '../../../src/bundle/bundle.ts';
import { canonicalJson } from '../../../src/bundle/canonical.ts';
import { parseBundle } from '../../../src/bundle/validate.ts';
import { UPGRADES, type UpgradeStep, upgradeBundle } from '../../../src/bundle/version.ts';

const text = readFileSync(
  join(import.meta.dirname, '..', '..', 'fixtures', 'bundle-format-v1.bundle.json'),
  'utf8',
);
const fixture = () => JSON.parse(text) as Record<string, unknown> & { study: { notes?: string } };

describe('bundle format versions', () => {
  it('the fixture is the current format and is read as it is', async () => {
    expect(BUNDLE_VERSION).toBe(1);
    expect(fixture().version).toBe(1);
    expect(Object.keys(UPGRADES)).toEqual([]);
    const r = await upgradeBundle(fixture());
    expect(r).toEqual({ ok: true, data: fixture(), upgradedFrom: null });
    expect((await parseBundle(text)).ok).toBe(true);
  });

  it('a newer version is refused, naming both versions', async () => {
    const newer = { ...fixture(), version: 2 };
    const r = await parseBundle(JSON.stringify(newer));
    expect(r).toEqual({
      ok: false,
      problems: [
        'version: this file is bundle format version 2, made by a newer version of Sure Enough; this program reads bundle format version 1 and older. Update the program to read it.',
      ],
    });
  });

  it.each([[0], [-1], [1.5], ['1'], [null], [undefined]])('version %j is refused', async (version) => {
    const r = await parseBundle(JSON.stringify({ ...fixture(), version }));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.problems[0]).toMatch(/^version: must be a whole number ≥ 1/);
  });

  const addNote: UpgradeStep = (b) => ({
    study: { ...(b.study as object), notes: 'upgraded from version 1' },
    events: b.events,
  });

  it('an older version is upgraded: the step runs, the version and the checksum are the new ones', async () => {
    const r = await upgradeBundle(fixture(), { 1: addNote }, 2);
    if (!r.ok) throw new Error(r.problem);
    expect(r.upgradedFrom).toBe(1);
    expect(r.data.version).toBe(2);
    const study = r.data.study as { notes: string };
    expect(study.notes).toBe('upgraded from version 1');
    const sha = createHash('sha256')
      .update(canonicalJson({ study: r.data.study, events: r.data.events }), 'utf8')
      .digest('hex');
    expect(r.data.checksum).toEqual({ algorithm: 'SHA-256', value: sha });
    expect(r.data.checksum).not.toEqual(fixture().checksum);
  });

  it('an older bundle changed after export is not upgraded', async () => {
    const damaged = fixture();
    damaged.study.notes = 'typed in later';
    const r = await upgradeBundle(damaged, { 1: addNote }, 2);
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.problem).toMatch(/^checksum\.value: does not match the content of this version 1 bundle/);
  });

  it('a missing step is named', async () => {
    expect(await upgradeBundle(fixture(), { 2: addNote }, 3)).toEqual({
      ok: false,
      problem: 'version: no upgrade from bundle format version 1 to 2',
    });
  });
});
