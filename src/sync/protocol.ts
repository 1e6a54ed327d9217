/**
 * The crew server's protocol — answers "what may a phone send the crew server, and what does it get back?"
 *
 * Shared by the phone (web/sync) and the server (src/server), so both read one definition of every request,
 * every limit and every refusal. The server stores a study's events and serves them; it computes no figure
 * (the crew view, crew-view.ts, is computed on each phone from the events, by the core).
 *
 * HTTP, JSON bodies (RFC 8259), under API_PREFIX:
 *
 * | request                                   | who            | body → answer                           |
 * | ----------------------------------------- | -------------- | --------------------------------------- |
 * | POST   /studies                           | anyone         | ShareRequest → 201 ShareResponse        |
 * | POST   /join                              | anyone         | JoinRequest → 200 JoinResponse          |
 * | GET    /studies/:id                       | a phone token  | → CrewResponse                          |
 * | POST   /studies/:id/events                | a phone token  | PushRequest → PushResponse              |
 * | GET    /studies/:id/events?after=C&limit=L | a phone token | → PullResponse                          |
 * | POST   /studies/:id/code                  | creator token  | → 200 CodeResponse (a new code; the old one stops working) |
 * | DELETE /studies/:id/code                  | creator token  | → 204 (no code works until a new one)   |
 * | DELETE /studies/:id/phones/:phoneId       | creator token  | → 204 (that phone's token stops working) |
 *
 * A phone token is sent as `Authorization: Bearer <token>` (RFC 6750) and opens exactly one study.
 * Refusals answer with a status and an ErrorBody: 400 malformed (problems name the field), 401 no or
 * unknown token, 403 a token of another study or a creator-only request, 404 no such study or code,
 * 409 a conflict (an event id already stored with other content; a study id already shared under another
 * share key), 413 body
 * over MAX_BODY_BYTES, 415 a body not sent as `Content-Type: application/json`, 429 too many attempts
 * (Retry-After). A refused request changes nothing.
 *
 * Pushing is idempotent: the event id is the key, an event already stored with the same content is
 * counted as already present, and a batch is stored whole or not at all. Pulling pages through the
 * study's events in the order the server stored them, after an opaque cursor; the pooled order used for
 * figures is pooled-order.ts (src/bundle), never the server's.
 */

import { eventProblems, studyProblems } from '../bundle/validate.ts';
import type { ObservationRecord, StudyRecord } from '../model/records.ts';

export const API_PREFIX = '/api/v1';
/** Largest request body the server reads (bytes). A batch of MAX_BATCH_EVENTS entries with notes fits. */
export const MAX_BODY_BYTES = 256 * 1024;
/** Most events in one push. */
export const MAX_BATCH_EVENTS = 200;
/** Most events in one pull page. */
export const MAX_PULL_EVENTS = 500;
/** Longest device id accepted. */
export const MAX_DEVICE_CHARS = 100;

export interface ShareRequest {
  study: StudyRecord;
  /** The sharing phone's device id (its events carry it). */
  device: string;
  /**
   * 32 random bytes (base64url, 43 characters) the sharing phone chose and kept before asking. A share of an
   * already shared study with the same key is the same phone asking again because the answer was lost on
   * the way: it is answered again, with a new token and a new crew code (the earlier ones, never received,
   * stop working). Any other share of a shared study is refused (409).
   */
  shareKey: string;
}
export interface ShareResponse {
  studyId: string;
  /** Canonical 16 symbols (crew-code.ts); show with formatCrewCode. */
  crewCode: string;
  token: string;
  phoneId: string;
}
export interface JoinRequest {
  code: string;
  device: string;
}
export interface JoinResponse {
  study: StudyRecord;
  token: string;
  phoneId: string;
}
export interface CodeResponse {
  crewCode: string;
}
export interface CrewPhone {
  phoneId: string;
  device: string;
  /** ISO 8601 time the phone joined (server clock). */
  joinedAt: string;
  creator: boolean;
  revoked: boolean;
}
export interface CrewResponse {
  study: StudyRecord;
  phones: CrewPhone[];
  /** The asking phone. */
  you: string;
}
export interface PushRequest {
  events: ObservationRecord[];
}
export interface PushResponse {
  /** Events of the batch stored now. */
  stored: number;
  /** Events of the batch the server held already (identical): a repeated push. */
  alreadyPresent: number;
}
export interface PullResponse {
  events: ObservationRecord[];
  /** Pass as `after` to get what follows; opaque text. */
  cursor: string;
  /** True when more events follow this page. */
  more: boolean;
}
export interface ErrorBody {
  error: string;
  /** Each problem names the field, e.g. `events[3].value: must be a number, got "7,5"`. */
  problems?: string[];
}

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Problems of a device id (`where` names the field). */
export function deviceProblems(device: unknown, where = 'device'): string[] {
  if (typeof device !== 'string') return [`${where}: missing or not text`];
  if (device.trim() === '') return [`${where}: must not be empty`];
  if (device.length > MAX_DEVICE_CHARS) return [`${where}: longer than ${MAX_DEVICE_CHARS} characters`];
  return [];
}

const SHARE_KEY = /^[A-Za-z0-9_-]{43}$/;

/** Problems of a ShareRequest (the study by the bundle's own rules and the one setup validator). */
export function shareProblems(body: unknown): string[] {
  if (!isObj(body)) return ['body: must be a JSON object with "study", "device" and "shareKey"'];
  const extra = Object.keys(body).filter((k) => k !== 'study' && k !== 'device' && k !== 'shareKey');
  const key =
    typeof body.shareKey === 'string' && SHARE_KEY.test(body.shareKey)
      ? []
      : ['shareKey: must be 32 random bytes in base64url (43 characters)'];
  return [
    ...extra.map((k) => `${k}: unknown field`),
    ...studyProblems(body.study),
    ...deviceProblems(body.device),
    ...key,
  ];
}

/** Problems of a JoinRequest (the code's own shape is checked by normalizeCrewCode). */
export function joinProblems(body: unknown): string[] {
  if (!isObj(body)) return ['body: must be a JSON object with "code" and "device"'];
  const extra = Object.keys(body).filter((k) => k !== 'code' && k !== 'device');
  const code = typeof body.code === 'string' ? [] : ['code: missing or not text'];
  return [...extra.map((k) => `${k}: unknown field`), ...code, ...deviceProblems(body.device)];
}

/** Problems of a JoinResponse as the phone receives it (the study by the bundle's own rules). */
export function joinAnswerProblems(body: unknown): string[] {
  if (!isObj(body)) return ['answer: not a JSON object'];
  const problems = studyProblems(body.study);
  if (typeof body.token !== 'string' || body.token === '') problems.push('token: missing');
  if (typeof body.phoneId !== 'string' || body.phoneId === '') problems.push('phoneId: missing');
  return problems;
}

/**
 * Problems of a PushRequest from the phone `device` for `study`: every event by the bundle's event rules,
 * of this study, recorded on this phone (a phone pushes only its own events: the others come from their
 * own phones), ids unique within the batch, 1 to MAX_BATCH_EVENTS events. Links (what a void or a
 * correction names) are checked by the server against what it holds.
 */
export function pushProblems(body: unknown, study: StudyRecord, device: string): string[] {
  if (!isObj(body) || !Array.isArray(body.events))
    return ['body: must be a JSON object with "events" (a list)'];
  const extra = Object.keys(body).filter((k) => k !== 'events');
  const events: unknown[] = body.events;
  const problems = extra.map((k) => `${k}: unknown field`);
  if (events.length === 0) problems.push('events: empty (send 1 or more events)');
  if (events.length > MAX_BATCH_EVENTS)
    return [...problems, `events: ${events.length} events; send at most ${MAX_BATCH_EVENTS} per request`];
  const seen = new Map<unknown, number>();
  events.forEach((e, i) => {
    const where = `events[${i}]`;
    problems.push(...eventProblems(e, where, study));
    if (!isObj(e)) return;
    if (typeof e.device === 'string' && e.device !== device)
      problems.push(
        `${where}.device: "${e.device.slice(0, 40)}" is not this phone; a phone sends only its own events`,
      );
    const first = seen.get(e.id);
    if (first !== undefined) problems.push(`${where}.id: same id as events[${first}]`);
    else seen.set(e.id, i);
  });
  return problems;
}
