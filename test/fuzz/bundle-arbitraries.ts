/**
 * Generators for fuzzing the study-bundle importer (not a test file): well-formed bundles following
 * src/bundle/SCHEMA.md, and faults planted in them, each with the path a message must name.
 * Generators are synchronous, so a generated bundle's checksum is computed here with Node's own SHA-256
 * (node:crypto, OpenSSL) over the canonical JSON the schema names — an implementation independent of the
 * app's (Web Crypto), which the importer then checks it against.
 */
import { createHash } from 'node:crypto';
import fc from 'fast-check';
import { expect } from 'vitest';
import { BUNDLE_FORMAT, BUNDLE_VERSION, type Bundle, KNOWN_KEYS } from '../../src/bundle/bundle.ts';
import { canonicalJson } from '../../src/bundle/canonical.ts';
import type { ObservationRecord, StudyRecord, StudySetup } from '../../src/model/records.ts';

// ---- well-formed bundles -------------------------------------------------------------------------

const hex = (n: number, width: number) => n.toString(16).padStart(width, '0').slice(-width);
export const uuidArb = fc
  .tuple(
    fc.nat(),
    fc.nat({ max: 0xffff }),
    fc.nat({ max: 0xfff }),
    fc.nat({ max: 0x3fff }),
    fc.nat(),
    fc.nat({ max: 0xffff }),
  )
  .map(
    ([a, b, c, d, e, f]) =>
      `${hex(a, 8)}-${hex(b, 4)}-4${hex(c, 3)}-${hex(0x8000 | d, 4)}-${hex(e, 8)}${hex(f, 4)}`,
  );
const text = fc.string({ minLength: 1, maxLength: 30 }).filter((s) => s.trim() !== '');

/** A bundle of already clean, seq-ordered records, checksummed with node:crypto (see the module note). */
export function sealedBundle(study: StudyRecord, events: ObservationRecord[]): Bundle {
  const value = createHash('sha256').update(canonicalJson({ study, events }), 'utf8').digest('hex');
  return {
    format: BUNDLE_FORMAT,
    version: BUNDLE_VERSION,
    study,
    events,
    checksum: { algorithm: 'SHA-256', value },
  };
}

const kindArb = fc.constantFrom<StudySetup['kind']>('measurement', 'count', 'pass-fail');

function valueFor(kind: StudySetup['kind']): fc.Arbitrary<number> {
  if (kind === 'count') return fc.nat({ max: 200 });
  if (kind === 'pass-fail') return fc.constantFrom(0, 1);
  return fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }).map((x) => x + 0);
}

export const goodBundle: fc.Arbitrary<Bundle> = kindArb.chain((kind) =>
  fc
    .record({
      studyId: uuidArb,
      name: text,
      notes: fc.option(fc.string({ maxLength: 60 }), { nil: undefined }),
      level: fc.constantFrom(0.8, 0.9, 0.95, 0.99),
      entries: fc.array(
        fc.record({
          id: uuidArb,
          value: valueFor(kind),
          note: fc.option(fc.string({ maxLength: 40 }), { nil: undefined }),
          label: fc.option(text, { nil: undefined }),
          position: fc.option(
            fc.record({
              lat: fc.double({ min: -90, max: 90, noNaN: true }),
              lon: fc.double({ min: -180, max: 180, noNaN: true }),
              accuracyM: fc.double({ min: 0, max: 5000, noNaN: true }),
            }),
            { nil: undefined },
          ),
        }),
        { minLength: 1, maxLength: 6 },
      ),
      voidFirst: fc.boolean(),
      voidId: uuidArb,
    })
    .filter((r) => new Set([...r.entries.map((e) => e.id), r.voidId]).size === r.entries.length + 1)
    .map((r) => {
      const setup: StudySetup = {
        kind,
        level: r.level,
        sided: 'two',
        rule: 'standard',
        min: 10,
        target: { kind: 'margin', value: 0.5 },
      };
      const study: StudyRecord = {
        id: r.studyId,
        name: r.name,
        createdAt: '2026-05-04T08:00:00+02:00',
        setup,
        version: 1,
      };
      if (r.notes !== undefined) study.notes = r.notes;
      const events: ObservationRecord[] = r.entries.map((e, i) => {
        const ev: ObservationRecord = {
          id: e.id,
          studyId: r.studyId,
          seq: i + 1,
          at: `2026-05-04T09:${String(i).padStart(2, '0')}:00+02:00`,
          value: e.value,
          device: 'phone-A',
        };
        if (e.note !== undefined) ev.note = e.note;
        if (e.label !== undefined) ev.label = e.label;
        // JSON has no negative zero
        if (e.position !== undefined)
          ev.position = {
            lat: e.position.lat + 0,
            lon: e.position.lon + 0,
            accuracyM: e.position.accuracyM + 0,
          };
        return ev;
      });
      if (r.voidFirst)
        events.push({
          id: r.voidId,
          studyId: r.studyId,
          seq: events.length + 1,
          at: '2026-05-04T10:00:00Z',
          device: 'phone-A',
          voids: events[0]!.id,
          reason: 'keyed twice',
        });
      return sealedBundle(study, events);
    }),
);

// ---- planted faults ------------------------------------------------------------------------------

// biome-ignore lint/suspicious/noExplicitAny: faults are planted in arbitrary parsed JSON
type Json = any;
export interface Fault {
  /** The damaged file. */
  file: string;
  /** A message must start with this path (followed by ": " or "."); undefined = any clear message. */
  path?: string;
  label: string;
}

const clone = (b: Bundle): Json => JSON.parse(JSON.stringify(b));
const isPlainObject = (v: unknown) => typeof v === 'object' && v !== null && !Array.isArray(v);
const jsonAny = fc.jsonValue({ maxDepth: 2 });

/** A JSON value that is not text. */
const notText = jsonAny.filter((v) => typeof v !== 'string');
/** A JSON value that is not a finite number. */
const notNumber = jsonAny.filter((v) => typeof v !== 'number');
const notObject = jsonAny.filter((v) => !isPlainObject(v));
const notUuid = fc.oneof(
  notText,
  fc.string({ maxLength: 40 }),
  uuidArb.map((u) => u.toUpperCase().replace(/^./, 'A')),
  uuidArb.map((u) => u.slice(1)),
  uuidArb.map((u) => `{${u}}`),
);
const notTime = fc.oneof(
  notText,
  fc.string({ maxLength: 30 }),
  fc.constantFrom(
    '2026-05-04 08:00:00+02:00',
    '2026-05-04T08:00:00',
    '2026-02-30T08:00:00Z',
    '2026-05-04T24:00:00Z',
    '2026-05-04T08:60:00Z',
    '2026-13-04T08:00:00Z',
    '2026-05-04T08:00:00+24:00',
    '04/05/2026',
    '1746338400000',
    '2026-05-04T08:00Z',
  ),
);

/** Where a fault can be planted: path, how to read/write it, and values that are wrong there. */
interface Slot {
  path: (b: Json) => string;
  get: (b: Json) => Json;
  required: boolean;
  wrong: (b: Json) => fc.Arbitrary<unknown>;
}

function at(obj: Json, keys: (string | number)[]): Json {
  return keys.reduce((o, k) => (o == null ? undefined : o[k]), obj);
}

/** A slot on a fixed path. */
function fixed(keys: string[], required: boolean, wrong: (b: Json) => fc.Arbitrary<unknown>): Slot {
  return { path: () => keys.join('.'), get: (b) => at(b, keys.slice(0, -1)), required, wrong };
}

const SLOTS: Record<string, Slot> = {
  studyId: fixed(['study', 'id'], true, () => notUuid),
  name: fixed(['study', 'name'], true, () => fc.oneof(notText, fc.constantFrom('', '   ', '\t\n'))),
  createdAt: fixed(['study', 'createdAt'], true, () => notTime),
  version: fixed(['study', 'version'], true, () => fc.oneof(notNumber, fc.constantFrom(0, -1, 1.5, 1e-9))),
  setup: fixed(['study', 'setup'], true, () => notObject),
  kind: fixed(['study', 'setup', 'kind'], true, () =>
    fc.oneof(
      notText,
      fc.string().filter((s) => !['measurement', 'count', 'pass-fail'].includes(s)),
    ),
  ),
  level: fixed(['study', 'setup', 'level'], true, () =>
    fc.oneof(
      notNumber,
      fc.double({ noNaN: true, noDefaultInfinity: true }).filter((x) => !(x > 0 && x < 1)),
    ),
  ),
  sided: fixed(['study', 'setup', 'sided'], true, () =>
    fc.oneof(notText, fc.constantFrom('both', 'Two', '')),
  ),
  rule: fixed(['study', 'setup', 'rule'], true, () =>
    fc.oneof(notText, fc.constantFrom('fast', 'Standard', '')),
  ),
  min: fixed(['study', 'setup', 'min'], true, () =>
    fc.oneof(notNumber, fc.integer({ min: -5, max: 0 }), fc.constantFrom(2.5, 0.1)),
  ),
  target: fixed(['study', 'setup', 'target'], false, () => notObject),
  targetValue: fixed(['study', 'setup', 'target', 'value'], true, () =>
    fc.oneof(notNumber, fc.double({ max: 0, noNaN: true, noDefaultInfinity: true })),
  ),
  notes: fixed(['study', 'notes'], false, () => notText),
  events: fixed(['events'], true, () => jsonAny.filter((v) => !Array.isArray(v))),
  checksumValue: fixed(['checksum', 'value'], true, () =>
    fc.oneof(
      notText,
      fc.string({ maxLength: 70 }).filter((s) => !/^[0-9a-f]{64}$/.test(s)),
    ),
  ),
  algorithm: fixed(['checksum', 'algorithm'], true, () =>
    fc.oneof(notText, fc.constantFrom('sha-256', 'SHA256', 'MD5', '')),
  ),
};

/** Slots inside events[i]. */
function eventSlot(
  key: string,
  required: (e: Json) => boolean,
  wrong: (b: Json, i: number) => fc.Arbitrary<unknown>,
): (i: number) => Slot {
  return (i) => ({
    path: () => `events[${i}].${key}`,
    get: (b) => b.events[i],
    required: false,
    wrong: (b) => wrong(b, i),
    ...{ requiredFor: required },
  });
}
const EVENT_SLOTS: Record<string, (i: number) => Slot> = {
  id: eventSlot(
    'id',
    () => true,
    () => notUuid,
  ),
  studyId: eventSlot(
    'studyId',
    () => true,
    () => fc.oneof(notUuid, uuidArb),
  ),
  seq: eventSlot(
    'seq',
    () => true,
    (_b, i) =>
      fc.oneof(
        notNumber,
        fc.integer().filter((n) => n !== i + 1),
      ),
  ),
  at: eventSlot(
    'at',
    () => true,
    () => notTime,
  ),
  device: eventSlot(
    'device',
    () => true,
    () => fc.oneof(notText, fc.constantFrom('', ' ')),
  ),
  note: eventSlot(
    'note',
    () => false,
    () => notText,
  ),
  value: eventSlot(
    'value',
    (e) => e.voids === undefined,
    (b, i) => {
      const kind = b.study.setup.kind;
      const isVoid = b.events[i].voids !== undefined;
      if (isVoid) return fc.double({ noNaN: true, noDefaultInfinity: true }); // a void carries no value
      if (kind === 'count')
        return fc.oneof(
          notNumber,
          fc.integer({ max: -1 }),
          fc.double({ min: 0.01, max: 0.99, noNaN: true }).map((f) => 3 + f),
        );
      if (kind === 'pass-fail') return fc.oneof(notNumber, fc.constantFrom(2, -1, 0.5, 1.0001));
      return notNumber;
    },
  ),
  position: eventSlot(
    'position',
    () => false,
    () => notObject,
  ),
  lat: eventSlot(
    'position.lat',
    () => false,
    () =>
      fc.oneof(
        notNumber,
        fc.double({ min: 90.0001, max: 1e9, noNaN: true }),
        fc.double({ min: -1e9, max: -90.0001, noNaN: true }),
      ),
  ),
};

/** Objects that refuse unknown members, and their known members. */
const OBJECTS: {
  keys: (string | number)[] | ((b: Json) => (string | number)[]);
  path: string;
  known: readonly string[];
}[] = [
  { keys: [], path: '(top level)', known: ['format', 'version', 'study', 'events', 'checksum'] },
  { keys: ['study'], path: 'study', known: KNOWN_KEYS.study },
  { keys: ['study', 'setup'], path: 'study.setup', known: KNOWN_KEYS.setup },
  {
    keys: ['study', 'setup', 'target'],
    path: 'study.setup.target',
    known: ['kind', 'value', 'source', 'date'],
  },
  { keys: ['events', 0], path: 'events[0]', known: KNOWN_KEYS.event },
  { keys: ['checksum'], path: 'checksum', known: ['algorithm', 'value'] },
];

/** Faults planted in one well-formed bundle. */
export function faultsIn(good: Bundle): fc.Arbitrary<Fault> {
  const b0 = clone(good);
  const n = b0.events.length;
  const slotArb = fc.oneof(
    fc.constantFrom(...Object.values(SLOTS)),
    fc.tuple(fc.constantFrom(...Object.values(EVENT_SLOTS)), fc.nat({ max: n - 1 })).map(([f, i]) => f(i)),
  );
  return fc.oneof(
    // a member of the wrong type or out of range
    slotArb
      .filter((s) => s.get(b0) !== undefined && (!s.path(b0).includes('position.') || s.get(b0).position))
      .chain((slot) =>
        slot.wrong(b0).map((v) => {
          const b = clone(good);
          const p = slot.path(b);
          const key = p.split('.').at(-1)!;
          const holder = p.includes('position.') ? slot.get(b).position : slot.get(b);
          holder[key] = v;
          return { file: JSON.stringify(b), path: p, label: `wrong ${p}` };
        }),
      ),
    // a required member removed
    fc
      .constantFrom(
        ['format'],
        ['version'],
        ['study'],
        ['events'],
        ['checksum'],
        ['study', 'id'],
        ['study', 'name'],
        ['study', 'createdAt'],
        ['study', 'setup'],
        ['study', 'version'],
        ['study', 'setup', 'kind'],
        ['study', 'setup', 'level'],
        ['study', 'setup', 'sided'],
        ['study', 'setup', 'rule'],
        ['study', 'setup', 'min'],
        ['checksum', 'algorithm'],
        ['checksum', 'value'],
      )
      .map((keys) => {
        const b = clone(good);
        delete at(b, keys.slice(0, -1))[keys.at(-1)!];
        return { file: JSON.stringify(b), path: keys.join('.'), label: `missing ${keys.join('.')}` };
      }),
    fc
      .tuple(fc.nat({ max: n - 1 }), fc.constantFrom('id', 'studyId', 'seq', 'at', 'device', 'value'))
      .filter(([i, k]) => k !== 'value' || b0.events[i].voids === undefined)
      .map(([i, k]) => {
        const b = clone(good);
        delete b.events[i][k];
        return { file: JSON.stringify(b), path: `events[${i}].${k}`, label: `missing events[${i}].${k}` };
      }),
    // an unknown member, including prototype-looking names
    fc
      .tuple(
        fc.constantFrom(...OBJECTS).filter((o) => at(b0, o.keys as (string | number)[]) !== undefined),
        fc.oneof(
          fc.string({ minLength: 1, maxLength: 12 }),
          fc.constantFrom('__proto__', 'constructor', 'prototype', 'toString', 'Value', 'ID'),
        ),
        jsonAny,
      )
      .filter(([o, key]) => !o.known.includes(key))
      .map(([o, key, v]) => {
        const b = clone(good);
        Object.defineProperty(at(b, o.keys as (string | number)[]), key, {
          value: v,
          enumerable: true,
          configurable: true,
          writable: true,
        });
        // the format/version checks come first; they are intact here, so the unknown member is reported
        return { file: JSON.stringify(b), path: `${o.path}.${key}`, label: `unknown ${o.path}.${key}` };
      }),
    // events out of order
    fc
      .tuple(fc.nat({ max: n - 1 }), fc.integer({ min: 1, max: Math.max(1, n - 1) }))
      .map(([i, d]) => [i, (i + d) % n] as const)
      .filter(([i, j]) => i !== j || n === 1)
      .map(([i, j]) => {
        if (i === j)
          return { file: JSON.stringify({ ...clone(good), events: {} }), path: 'events', label: 'swapped' };
        const b = clone(good);
        [b.events[i], b.events[j]] = [b.events[j], b.events[i]];
        const first = Math.min(i, j);
        return { file: JSON.stringify(b), path: `events[${first}].seq`, label: 'swapped' };
      }),
    // a value changed after export: the checksum no longer matches
    fc.tuple(fc.nat({ max: n - 1 }), fc.string({ minLength: 1, maxLength: 8 })).map(([i, extra]) => {
      const b = clone(good);
      b.events[i].device = `${b.events[i].device}${extra}`;
      return { file: JSON.stringify(b), path: 'checksum.value', label: 'tampered' };
    }),
    // the file cut short (a prefix of a JSON object text is never valid JSON)
    fc.nat().map((k) => {
      const full = JSON.stringify(good);
      return { file: full.slice(0, k % full.length), path: 'file', label: 'truncated' };
    }),
    // not a bundle at all
    fc.jsonValue().map((v) => ({ file: JSON.stringify(v) ?? 'null', label: 'arbitrary JSON' })),
    fc.string({ maxLength: 200 }).map((s) => ({ file: s, label: 'arbitrary text' })),
  );
}

export const faultArb: fc.Arbitrary<Fault> = goodBundle.chain(faultsIn);

// ---- checks --------------------------------------------------------------------------------------

const WHERE = /^(file|format|version|\(top level\)|study|events|checksum)[\s\S]*?: \S/;
const MORE = /^… and \d+ more problems$/;

export function expectClearProblems(problems: string[]): void {
  expect(problems.length).toBeGreaterThan(0);
  expect(problems.length).toBeLessThanOrEqual(51);
  for (const p of problems) expect(WHERE.test(p) || MORE.test(p), `unclear message: ${p}`).toBe(true);
}
