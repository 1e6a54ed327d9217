/**
 * Import safety: untrusted text → a typed study bundle, or the list of every problem found, each naming
 * what and where (`events[12].at: not an ISO 8601 time with UTC offset`). Never a partial bundle.
 *
 * Order of checks: JSON syntax; `format` and `version` (a file that is not a bundle, or is from a newer
 * version, stops here; an older version is upgraded first, version.ts); then every field of `study`, `study.setup` and each event; then links between
 * events (duplicate ids, voids that point nowhere); and last the checksum, which is only meaningful
 * once the structure is right.
 */
import type { ObservationRecord, StudyRecord } from '../model/records.ts';
import { setupPath, setupProblems } from '../model/setup.ts';
import { valueProblem } from '../model/value.ts';
import { BUNDLE_FORMAT, BUNDLE_VERSION, type Bundle, bundleChecksum, KNOWN_KEYS } from './bundle.ts';
import { upgradeBundle } from './version.ts';

export type BundleResult = { ok: true; bundle: Bundle } | { ok: false; problems: string[] };

/** At most this many problems are listed (then "… and N more"). */
const MAX_PROBLEMS = 50;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
const ISO_TIME = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})(\.\d{1,9})?(Z|([+-])(\d{2}):(\d{2}))$/;
const HEX64 = /^[0-9a-f]{64}$/;

/**
 * True when `text` is an RFC 3339 date-time (the ISO 8601 profile with seconds and a UTC offset),
 * with a real calendar date, hours 00–23, minutes and seconds 00–59, and offset within ±23:59.
 */
export function isIsoTimeWithOffset(text: string): boolean {
  const m = ISO_TIME.exec(text);
  if (!m) return false;
  const [y, mo, d, h, mi, s] = [m[1], m[2], m[3], m[4], m[5], m[6]].map(Number) as number[];
  if (mo! < 1 || mo! > 12 || d! < 1 || h! > 23 || mi! > 59 || s! > 59) return false;
  const daysInMonth = new Date(Date.UTC(y!, mo!, 0)).getUTCDate();
  if (d! > daysInMonth) return false;
  if (m[9] !== undefined && (Number(m[10]) > 23 || Number(m[11]) > 59)) return false;
  return Number.isFinite(Date.parse(text));
}

/** True for a lower-case RFC 9562 UUID text (8-4-4-4-12 hexadecimal digits). */
export function isUuid(text: unknown): text is string {
  return typeof text === 'string' && UUID.test(text);
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const isNum = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
const show = (v: unknown): string =>
  v === null
    ? 'null'
    : Array.isArray(v)
      ? 'an array'
      : typeof v === 'string'
        ? `"${v.slice(0, 40)}"`
        : // an object: never String(v), which throws for hostile ones such as {"toString": 1}
          typeof v === 'object'
          ? 'an object'
          : String(v);

class Problems {
  list: string[] = [];
  add(where: string, what: string): void {
    this.list.push(`${where}: ${what}`);
  }
  unknownKeys(where: string, obj: Obj, known: readonly string[]): void {
    for (const k of Object.keys(obj))
      if (!known.includes(k))
        this.add(`${where}.${k}`, `unknown field (not in bundle format version ${BUNDLE_VERSION})`);
  }
  string(where: string, v: unknown, required: boolean, nonEmpty = false): void {
    if (v === undefined) {
      if (required) this.add(where, 'missing');
    } else if (typeof v !== 'string') this.add(where, `must be text, got ${show(v)}`);
    else if (nonEmpty && v.trim() === '') this.add(where, 'must not be empty');
  }
  number(where: string, v: unknown, required: boolean, test?: (n: number) => boolean, rule?: string): void {
    if (v === undefined) {
      if (required) this.add(where, 'missing');
    } else if (!isNum(v)) this.add(where, `must be a number, got ${show(v)}`);
    else if (test && !test(v)) this.add(where, `must be ${rule}, got ${v}`);
  }
  uuid(where: string, v: unknown, required: boolean): void {
    if (v === undefined) {
      if (required) this.add(where, 'missing');
    } else if (!isUuid(v)) this.add(where, `not a lower-case UUID, got ${show(v)}`);
  }
  time(where: string, v: unknown): void {
    if (v === undefined) this.add(where, 'missing');
    else if (typeof v !== 'string' || !isIsoTimeWithOffset(v))
      this.add(
        where,
        `not an ISO 8601 time with UTC offset (e.g. 2026-05-04T09:15:00+02:00), got ${show(v)}`,
      );
  }
}

const positiveInt = (n: number) => Number.isInteger(n) && n >= 1;

/** The setup's own rules live in src/model/setup.ts (shared with the form, the CLI and the core). */
function checkSetup(p: Problems, setup: unknown): void {
  if (setup === undefined) {
    p.add('study.setup', 'missing');
    return;
  }
  for (const q of setupProblems(setup)) p.add(setupPath('study.setup', q.path), q.message);
}

function checkStudy(p: Problems, study: unknown): void {
  if (study === undefined) {
    p.add('study', 'missing');
    return;
  }
  if (!isObj(study)) {
    p.add('study', `must be an object, got ${show(study)}`);
    return;
  }
  p.unknownKeys('study', study, KNOWN_KEYS.study);
  p.uuid('study.id', study.id, true);
  p.string('study.name', study.name, true, true);
  p.time('study.createdAt', study.createdAt);
  p.number('study.version', study.version, true, positiveInt, 'a whole number ≥ 1');
  p.uuid('study.supersedes', study.supersedes, false);
  p.string('study.notes', study.notes, false);
  checkSetup(p, study.setup);
}

/**
 * One event's rules. `i` is its index in the bundle, whose `seq` must be i + 1; a batch event (`i` null,
 * see eventProblems) needs only a whole-number `seq` ≥ 1, its place in its own phone's log.
 */
function checkEvent(p: Problems, e: unknown, i: number | null, study: Obj, where?: string): void {
  const w = where ?? `events[${i}]`;
  if (!isObj(e)) {
    p.add(w, `must be an object, got ${show(e)}`);
    return;
  }
  p.unknownKeys(w, e, KNOWN_KEYS.event);
  p.uuid(`${w}.id`, e.id, true);
  if (e.studyId === undefined) p.add(`${w}.studyId`, 'missing');
  else if (e.studyId !== study.id)
    p.add(`${w}.studyId`, `${show(e.studyId)} is not this bundle's study (${show(study.id)})`);
  if (i === null) p.number(`${w}.seq`, e.seq, true, positiveInt, 'a whole number ≥ 1');
  else
    p.number(`${w}.seq`, e.seq, true, (n) => n === i + 1, `${i + 1} (events are numbered 1, 2, 3… in order)`);
  p.time(`${w}.at`, e.at);
  p.string(`${w}.device`, e.device, true, true);
  for (const k of ['stratum', 'cluster', 'note', 'label'] as const) p.string(`${w}.${k}`, e[k], false);
  if (e.position !== undefined) {
    const pos = e.position;
    if (!isObj(pos)) p.add(`${w}.position`, `must be an object, got ${show(pos)}`);
    else {
      p.unknownKeys(`${w}.position`, pos, KNOWN_KEYS.position);
      p.number(
        `${w}.position.lat`,
        pos.lat,
        true,
        (n) => n >= -90 && n <= 90,
        'a latitude in degrees, −90 to 90',
      );
      p.number(
        `${w}.position.lon`,
        pos.lon,
        true,
        (n) => n >= -180 && n <= 180,
        'a longitude in degrees, −180 to 180',
      );
      p.number(`${w}.position.accuracyM`, pos.accuracyM, true, (n) => n >= 0, 'metres ≥ 0');
    }
  }
  if (e.voids !== undefined) {
    p.uuid(`${w}.voids`, e.voids, true);
    p.string(`${w}.reason`, e.reason, true, true);
    if (e.value !== undefined) p.add(`${w}.value`, 'a void event carries no value');
    if (e.censored !== undefined) p.add(`${w}.censored`, 'a void event carries no value');
    if (e.corrects !== undefined) p.add(`${w}.corrects`, 'only entries (with a value) correct another entry');
    return;
  }
  p.uuid(`${w}.corrects`, e.corrects, false);
  if (e.reason !== undefined) p.add(`${w}.reason`, 'only void events (with "voids") carry a reason');
  const kind = isObj(study.setup) ? study.setup.kind : undefined;
  const v = e.value;
  if (v === undefined) p.add(`${w}.value`, 'missing (an entry needs a value; a void needs "voids")');
  else if (!isNum(v)) p.add(`${w}.value`, `must be a number, got ${show(v)}`);
  else if (kind === 'measurement' || kind === 'count' || kind === 'pass-fail') {
    // the one value rule (src/model/value.ts); the censored member is checked on its own below
    const problem = valueProblem(v, kind, false);
    if (problem !== null) p.add(`${w}.value`, problem.startsWith('is ') ? `${v} ${problem}` : problem);
  }
  if (e.censored !== undefined) {
    if (typeof e.censored !== 'boolean')
      p.add(`${w}.censored`, `must be true or false, got ${show(e.censored)}`);
    else if (e.censored && kind !== 'measurement')
      p.add(`${w}.censored`, 'only measurements can be below a reporting limit');
  }
}

function checkLinks(p: Problems, events: Obj[]): void {
  const firstIndex = new Map<string, number>();
  events.forEach((e, i) => {
    if (typeof e.id !== 'string') return;
    const seen = firstIndex.get(e.id);
    if (seen !== undefined) p.add(`events[${i}].id`, `same id as events[${seen}]`);
    else firstIndex.set(e.id, i);
  });
  events.forEach((e, i) => {
    if (typeof e.voids !== 'string' || !isUuid(e.voids)) return;
    const target = firstIndex.get(e.voids);
    if (target === undefined) p.add(`events[${i}].voids`, `no entry with id ${e.voids} in this bundle`);
    else if (events[target]!.voids !== undefined)
      p.add(`events[${i}].voids`, `events[${target}] is itself a void; only entries can be voided`);
    else if (target === i) p.add(`events[${i}].voids`, 'an event cannot void itself');
  });
  // a correction names the entry it replaces: an entry of this bundle that some void withdraws (not
  // necessarily earlier in the file: merged logs follow the phones' clocks, which may disagree)
  const voided = new Set(events.map((e) => e.voids).filter((v): v is string => typeof v === 'string'));
  events.forEach((e, i) => {
    if (typeof e.corrects !== 'string' || !isUuid(e.corrects)) return;
    const target = firstIndex.get(e.corrects);
    if (target === undefined || events[target]!.voids !== undefined)
      p.add(`events[${i}].corrects`, `no entry with id ${e.corrects} in this bundle`);
    else if (!voided.has(e.corrects))
      p.add(
        `events[${i}].corrects`,
        `events[${target}] is not voided; a correction voids the entry it replaces`,
      );
  });
}

/** The problems of a study record received on its own (a study shared with the crew server). */
export function studyProblems(study: unknown): string[] {
  const p = new Problems();
  checkStudy(p, study);
  return p.list;
}

/**
 * The problems of one event received on its own (the crew server takes a phone's events in batches): the
 * same rules as an event of a bundle — fields, values by the study's data kind, void and correction shape —
 * except that `seq` is the event's place in its own phone's log (a whole number ≥ 1), and links to other
 * events (what a void or a correction names) are the caller's to check against what it holds.
 * `where` names the event in the messages, e.g. `events[3]`.
 */
export function eventProblems(e: unknown, where: string, study: StudyRecord): string[] {
  const p = new Problems();
  checkEvent(p, e, null, study as unknown as Obj, where);
  return p.list;
}

/**
 * Validates untrusted bundle text. Resolves to the typed bundle, or every problem found (never a partial
 * bundle). Asynchronous because of the checksum (the platform's SHA-256): validate before opening an
 * IndexedDB transaction.
 */
export async function parseBundle(text: string): Promise<BundleResult> {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    return { ok: false, problems: [`file: not valid JSON (${(err as Error).message})`] };
  }
  return validateBundle(data);
}

/** Validates an already-parsed value (see parseBundle). */
export async function validateBundle(input: unknown): Promise<BundleResult> {
  const p = new Problems();
  if (!isObj(input)) return { ok: false, problems: [`file: must be a JSON object, got ${show(input)}`] };
  if (input.format !== BUNDLE_FORMAT)
    return {
      ok: false,
      problems: [`format: not a study bundle (expected "${BUNDLE_FORMAT}", got ${show(input.format)})`],
    };
  // a newer version is refused naming both versions; an older one is upgraded first (version.ts)
  const versioned = await upgradeBundle(input);
  if (!versioned.ok) return { ok: false, problems: [versioned.problem] };
  const data = versioned.data;
  p.unknownKeys('(top level)', data, ['format', 'version', 'study', 'events', 'checksum']);
  checkStudy(p, data.study);
  const study = isObj(data.study) ? data.study : {};
  if (data.events === undefined) p.add('events', 'missing');
  else if (!Array.isArray(data.events)) p.add('events', `must be an array, got ${show(data.events)}`);
  else {
    data.events.forEach((e, i) => {
      checkEvent(p, e, i, study);
    });
    checkLinks(p, data.events.filter(isObj));
  }
  const c = data.checksum;
  if (c === undefined) p.add('checksum', 'missing');
  else if (!isObj(c)) p.add('checksum', `must be an object, got ${show(c)}`);
  else {
    p.unknownKeys('checksum', c, ['algorithm', 'value']);
    if (c.algorithm !== 'SHA-256') p.add('checksum.algorithm', `must be "SHA-256", got ${show(c.algorithm)}`);
    if (typeof c.value !== 'string' || !HEX64.test(c.value))
      p.add('checksum.value', `must be 64 lower-case hexadecimal digits, got ${show(c.value)}`);
  }
  if (p.list.length === 0) {
    const computed = await bundleChecksum(data.study as StudyRecord, data.events as ObservationRecord[]);
    if (computed !== (c as Obj).value)
      p.add(
        'checksum.value',
        `does not match the content (file says ${(c as Obj).value as string}, content gives ${computed}): the file was changed or damaged after export`,
      );
  }
  if (p.list.length > 0) {
    const extra = p.list.length - MAX_PROBLEMS;
    const problems = p.list.slice(0, MAX_PROBLEMS);
    if (extra > 0) problems.push(`… and ${extra} more problems`);
    return { ok: false, problems };
  }
  return { ok: true, bundle: data as unknown as Bundle };
}
