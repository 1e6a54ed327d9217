/**
 * Import safety: a malformed bundle gives messages naming what and where; a good one round-trips.
 * Outside checks: RFC 8785 canonical form compared with Python's json.dumps(sort_keys=True,
 * separators=(',', ':'), ensure_ascii=False) — identical for data without astral-plane keys or exotic
 * number forms (RFC 8785 §3.2.3 sorts by UTF-16 units, Python by code points); RFC 3339 §5.6 date-time
 * grammar for times.
 */
import { describe, expect, it } from 'vitest';
import { bundleChecksum, makeBundle, serializeBundle } from '../../../src/bundle/bundle.ts';
import { canonicalJson } from '../../../src/bundle/canonical.ts';
import { isIsoTimeWithOffset, parseBundle } from '../../../src/bundle/validate.ts';
import { pythonOracle } from '../../fixtures/python-oracle.ts';
import { entries, study, uuid, voidOf } from './make.ts';

// Python's json and hashlib, run once and committed (test/fixtures/python-bundle-validate.json)
const python = pythonOracle('bundle-validate');

async function good() {
  const st = study();
  const ev = entries(st, [3, 0, 5, 2, 7], 'phone-A', 2, 0, (i) => ({
    label: `Q${i + 1}`,
    position: { lat: 52.1 + i / 1000, lon: 5.2, accuracyM: 6 },
  }));
  ev.push(voidOf(st, ev[1]!, 6, uuid(3, 1)));
  return makeBundle(st, ev);
}

/** Serialise, let `mutate` damage the parsed JSON, and re-checksum unless told not to. */
// biome-ignore lint/suspicious/noExplicitAny: the test damages arbitrary parsed JSON
async function damaged(mutate: (b: Record<string, any>) => void, rechecksum = true): Promise<string> {
  const b = JSON.parse(serializeBundle(await good()));
  mutate(b);
  if (rechecksum && b.study && Array.isArray(b.events)) {
    try {
      b.checksum.value = await bundleChecksum(b.study, b.events);
    } catch {
      /* values JSON cannot hold stay as they are */
    }
  }
  return JSON.stringify(b);
}

async function problemsOf(text: string | Promise<string>): Promise<string[]> {
  const r = await parseBundle(await text);
  if (r.ok) throw new Error('expected problems');
  return r.problems;
}

describe('canonicalJson (RFC 8785) vs Python json.dumps(sort_keys=True)', () => {
  it('matches on a bundle-like object', () => {
    const value = {
      zeta: [1, 2.5, -0.001, 1e-7, 123456789012, { b: true, a: null, ä: 'x' }],
      alpha: 'quote " backslash \\ newline \n tab \t é 🌿',
      Mixed: { B: 1, a: 2, _: 3 },
    };
    const py = python(
      'import sys,json; print(json.dumps(json.load(sys.stdin), sort_keys=True, separators=(",",":"), ensure_ascii=False), end="")',
      JSON.stringify(value),
    );
    // Python prints 1e-07 where ECMAScript prints 1e-7 (RFC 8785 §3.2.2.3 follows ECMAScript).
    expect(canonicalJson(value)).toBe(py.replace('1e-07', '1e-7'));
  });
  it('RFC 8785 §3.2.3 sorting by UTF-16 code units', () => {
    // RFC 8785 §3.2.3 example (evidence: memory of the RFC text); it orders "\u20ac" (€), "\r", "\ufb33", "1", "\ud83d\ude00", "\u0080", "\u00f6".
    const keys = ['\u20ac', '\r', '\ufb33', '1', '\ud83d\ude00', '\u0080', '\u00f6'];
    const obj = Object.fromEntries(keys.map((k, i) => [k, i]));
    // (Object.keys would put the integer-like "1" first, so read the order from the text itself.)
    const expected = ['\r', '1', '\u0080', '\u00f6', '\u20ac', '\ud83d\ude00', '\ufb33'];
    expect(canonicalJson(obj)).toBe(
      `{${expected.map((k) => `${JSON.stringify(k)}:${keys.indexOf(k)}`).join(',')}}`,
    );
  });
  it('refuses non-finite numbers', () => {
    expect(() => canonicalJson({ a: Number.NaN })).toThrow(RangeError);
  });
});

describe('isIsoTimeWithOffset (RFC 3339 §5.6)', () => {
  it.each([
    '2026-05-04T09:15:00+02:00',
    '2026-05-04T09:15:00Z',
    '2026-05-04T09:15:00.123-05:30',
    '2024-02-29T23:59:59+14:00',
  ])('accepts %s', (t) => expect(isIsoTimeWithOffset(t)).toBe(true));
  it.each([
    '2026-05-04T09:15:00', // no offset
    '2026-05-04 09:15:00Z', // space
    '2026-02-29T10:00:00Z', // not a leap year
    '2026-13-01T10:00:00Z',
    '2026-05-04T24:00:00Z',
    '2026-05-04T09:15Z', // no seconds
    '04/05/2026 09:15',
    '2026-05-04T09:15:00+25:00',
  ])('refuses %s', (t) => expect(isIsoTimeWithOffset(t)).toBe(false));
});

describe('parseBundle', () => {
  it('round trip: bundle → text → parse gives the identical bundle', async () => {
    const b = await good();
    const r = await parseBundle(serializeBundle(b));
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.bundle).toEqual(b);
    if (r.ok) expect(serializeBundle(r.bundle)).toBe(serializeBundle(b));
  });

  it('bad JSON', async () => {
    const p = await problemsOf('{"format": "sure-enough-bundle", ');
    expect(p).toHaveLength(1);
    expect(p[0]).toMatch(/^file: not valid JSON/);
  });
  it('not an object', async () =>
    expect((await problemsOf('[1,2]'))[0]).toMatch(/^file: must be a JSON object/));
  it('wrong format', async () =>
    expect(await problemsOf(damaged((b) => (b.format = 'something-else')))).toEqual([
      'format: not a study bundle (expected "sure-enough-bundle", got "something-else")',
    ]));
  it('newer version', async () =>
    expect((await problemsOf(damaged((b) => (b.version = 2))))[0]).toMatch(
      /^version: this file is bundle format version 2, made by a newer version .*reads bundle format version 1 and older/,
    ));
  it('failed checksum: one value changed after export', async () => {
    const p = await problemsOf(damaged((b) => (b.events[2].value = 6), false));
    expect(p).toHaveLength(1);
    expect(p[0]).toMatch(/^checksum\.value: does not match the content/);
  });
  it('failed checksum: study name changed after export', async () => {
    expect((await problemsOf(damaged((b) => (b.study.name = 'x'), false)))[0]).toMatch(/^checksum\.value/);
  });
  it('missing checksum', async () =>
    expect(await problemsOf(damaged((b) => delete b.checksum))).toEqual(['checksum: missing']));
  it('missing fields name each place', async () => {
    const p = await problemsOf(
      damaged((b) => {
        delete b.study.setup.level;
        delete b.events[3].at;
        delete b.events[0].device;
      }),
    );
    expect(p).toContain('study.setup.level: missing');
    expect(p).toContain('events[3].at: missing');
    expect(p).toContain('events[0].device: missing');
  });
  it('bad time names the event', async () => {
    const p = await problemsOf(damaged((b) => (b.events[4].at = '2026-05-04 09:15')));
    expect(p).toEqual([
      'events[4].at: not an ISO 8601 time with UTC offset (e.g. 2026-05-04T09:15:00+02:00), got "2026-05-04 09:15"',
    ]);
  });
  it('values that do not fit the data kind', async () => {
    const p = await problemsOf(
      damaged((b) => {
        b.events[0].value = 2.5;
        b.events[1].value = -1;
        b.events[2].value = '4';
        b.events[3].value = 1e200;
      }),
    );
    expect(p).toEqual([
      'events[0].value: 2.5 is not a whole number; counts are whole numbers ≥ 0',
      'events[1].value: -1 is negative; counts are whole numbers ≥ 0',
      'events[2].value: must be a number, got "4"',
      // (1e200)² overflows a double (IEEE 754 binary64, largest finite ≈ 1.8e308)
      'events[3].value: 1e+200 is beyond ±1e150, more than the statistics can square; write it in a larger unit',
    ]);
  });
  it('position out of range and swapped', async () => {
    const p = await problemsOf(
      damaged((b) => (b.events[0].position = { lat: 152.1, lon: 5.2, accuracyM: -1 })),
    );
    expect(p).toEqual([
      'events[0].position.lat: must be a latitude in degrees, −90 to 90, got 152.1',
      'events[0].position.accuracyM: must be metres ≥ 0, got -1',
    ]);
  });
  it('seq out of order, duplicate id, dangling void, foreign study id', async () => {
    const p = await problemsOf(
      damaged((b) => {
        b.events[1].seq = 7;
        b.events[2].id = b.events[0].id;
        b.events[5].voids = uuid(9, 9);
        b.events[3].studyId = uuid(8, 8);
      }),
    );
    expect(p).toContain('events[1].seq: must be 2 (events are numbered 1, 2, 3… in order), got 7');
    expect(p).toContain('events[2].id: same id as events[0]');
    expect(p).toContain(`events[5].voids: no entry with id ${uuid(9, 9)} in this bundle`);
    expect(p.some((x) => x.startsWith('events[3].studyId: '))).toBe(true);
  });
  it('a correction links to the voided entry it replaces; a dangling, live or misplaced link is named', async () => {
    // event 1 is voided by event 5 (good()); a correcting entry names it
    const ok = await parseBundle(
      await damaged((b) => {
        b.events.push({ ...b.events[4], id: uuid(4, 1), seq: 7, value: 1, corrects: b.events[1].id });
        delete b.events[6].label;
      }),
    );
    expect(ok.ok).toBe(true);
    const p = await problemsOf(
      damaged((b) => {
        b.events[0].corrects = uuid(9, 9);
        b.events[2].corrects = b.events[3].id;
        b.events[5].corrects = b.events[1].id;
      }),
    );
    expect(p).toContain(`events[0].corrects: no entry with id ${uuid(9, 9)} in this bundle`);
    expect(p).toContain(
      'events[2].corrects: events[3] is not voided; a correction voids the entry it replaces',
    );
    expect(p).toContain('events[5].corrects: only entries (with a value) correct another entry');
  });
  it('unknown fields and a void with a value', async () => {
    const p = await problemsOf(
      damaged((b) => {
        b.events[5].value = 3;
        b.study.colour = 'red';
      }),
    );
    expect(p).toContain('study.colour: unknown field (not in bundle format version 1)');
    expect(p).toContain('events[5].value: a void event carries no value');
  });
  it('bad setup', async () => {
    const p = await problemsOf(
      damaged((b) => {
        b.study.setup.kind = 'weight';
        b.study.setup.level = 95;
        b.study.setup.target = { kind: 'margin', value: -2 };
      }),
    );
    expect(p).toContain('study.setup.kind: must be measurement, count or pass-fail, got "weight"');
    // the setup's words are the one setup validator's (src/model/setup.ts), the same on every surface
    expect(p).toContain('study.setup.level: must be strictly between 0 and 1 (0 % and 100 %)');
    expect(p).toContain('study.setup.target.value: must be greater than 0');
  });
  it('never a partial bundle: any problem means no bundle', async () => {
    const r = await parseBundle(await damaged((b) => (b.events[4].at = 'yesterday')));
    expect(r.ok).toBe(false);
    expect('bundle' in r).toBe(false);
  });
  it('lists at most 50 problems', async () => {
    const p = await problemsOf(
      damaged((b) => {
        for (let i = 0; i < 60; i++) b.events.push({ ...b.events[0], seq: 7 + i, at: 'x', id: uuid(5, i) });
      }),
    );
    expect(p).toHaveLength(51);
    expect(p[50]).toMatch(/and \d+ more problems/);
  });
});

describe('checksum reproduced outside the app (the Python recipe in src/bundle/SCHEMA.md)', () => {
  it('Python json + hashlib give the same SHA-256', async () => {
    const b = await good();
    const py = python(
      "import sys, json, hashlib\nb = json.loads(sys.stdin.buffer.read().decode('utf-8'))\ntext = json.dumps({'study': b['study'], 'events': b['events']}, sort_keys=True, separators=(',', ':'), ensure_ascii=False)\nprint(hashlib.sha256(text.encode('utf-8')).hexdigest(), end='')",
      serializeBundle(b),
    );
    expect(py).toBe(b.checksum.value);
  });
});

describe('setup members added for strata and designs', () => {
  it('a stratified setup round-trips; bad strata are named', async () => {
    const st = study({
      strata: [
        { name: 'wet', weight: 2 },
        { name: 'dry', weight: 1, cost: 3, population: 40 },
      ],
    });
    const b = await makeBundle(
      st,
      entries(st, [1, 2], 'x', 2, 0, (i) => ({ stratum: i ? 'dry' : 'wet' })),
    );
    const r = await parseBundle(serializeBundle(b));
    expect(r.ok && r.bundle.study.setup.strata).toEqual(st.setup.strata);
    const bad = JSON.parse(serializeBundle(b));
    bad.study.setup.strata = [
      { name: 'wet', weight: 0 },
      { name: 'wet', weight: 1, colour: 'red' },
    ];
    bad.study.setup.design = 'grid';
    bad.checksum.value = await bundleChecksum(bad.study, bad.events);
    const p = await problemsOf(JSON.stringify(bad));
    expect(p).toEqual([
      'study.setup.strata[0].weight: must be greater than 0 (stratum "wet")',
      'study.setup.strata[1].colour: unknown field (not part of a study setup)',
      'study.setup.strata[1].name: "wet" is listed twice',
      'study.setup.design: must be composite, got "grid"',
    ]);
  });
  it('makeBundle leaves out storage-only members but keeps every record member', async () => {
    const st = { ...study(), lockedAt: '2026-05-04T09:00:00+02:00', archivedAt: undefined };
    const ev = entries(st, [1], 'x', 2).map((e) => ({ ...e, localOnly: 1 }));
    const b = await makeBundle(st, ev);
    expect('lockedAt' in b.study).toBe(false);
    expect('localOnly' in (b.events[0] as object)).toBe(false);
    expect((await parseBundle(serializeBundle(b))).ok).toBe(true);
  });
});
