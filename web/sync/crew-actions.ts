/**
 * What a crew member does with the crew server by hand: share a study, join one with a crew code, and —
 * on the phone that shared it — make a new code, stop the code, list and remove phones
 * (src/sync/protocol.ts). Each answers with words for the screen; none retries by itself.
 */
import type { CodeResponse, CrewResponse, JoinResponse, ShareResponse, StudyRecord } from '../core.ts';
import { loadCore } from '../core-loader.ts';
import { getLink, saveLink, updateLink } from '../storage/crew.ts';
import { writeImport } from '../storage/import.ts';
import { deviceId, shareKeyFor } from '../storage/meta.ts';
import type { CrewLink, StoredStudy } from '../storage/schema.ts';
import { getStudy } from '../storage/studies.ts';
import { isoWithOffset } from '../storage/time.ts';
import { type Reply, request } from './api.ts';
import { apiUrl, deps } from './deps.ts';
import { syncStudy } from './engine.ts';

export type Done<T> = { ok: true; value: T } | { ok: false; message: string };

/** The server the app is served from (the only one its content security policy allows). */
const SERVER = '';

const fail = (message: string): { ok: false; message: string } => ({ ok: false, message });

/** Words for a request that did not go through, when the crew member is waiting for it. */
function notDone(r: Exclude<Reply<unknown>, { kind: 'ok' }>, what: string): string {
  if (r.kind === 'retry') {
    if (r.status === 429) {
      const min = r.retryAfterMs === null ? null : Math.max(1, Math.ceil(r.retryAfterMs / 60_000));
      return `${what}: too many tries. Wait ${min === null ? 'a few minutes' : `about ${min} min`} and try again.`;
    }
    if (r.status === null)
      return `${what}: no connection to the crew server. Try again when the phone has signal.`;
    return `${what}: the crew server is not answering properly (${r.error}). Try again in a few minutes.`;
  }
  const detail = [r.error, ...r.problems.slice(0, 3)].join('; ');
  return `${what}: the crew server refused (${detail}).`;
}

/** The shared record: exactly the study's StudyRecord fields (the phone's housekeeping stays here). */
function recordOf(s: StoredStudy): StudyRecord {
  const r: StudyRecord = {
    id: s.id,
    name: s.name,
    createdAt: s.createdAt,
    setup: s.setup,
    version: s.version,
  };
  if (s.notes !== undefined) r.notes = s.notes;
  if (s.supersedes !== undefined) r.supersedes = s.supersedes;
  return r;
}

/** Shares a study of this phone with a crew: the server answers with the crew code and this phone's token. */
export async function shareStudy(studyId: string): Promise<Done<CrewLink>> {
  const core = await loadCore();
  const study = await getStudy(studyId);
  if (!study) return fail('Not shared: this study is not on this phone.');
  if (study.demo) return fail('Not shared: the demo holds invented data and is not shared with a crew.');
  const [device, shareKey] = await Promise.all([deviceId(), shareKeyFor(studyId)]);
  const r = await request<ShareResponse>(deps, apiUrl(SERVER, core.API_PREFIX, '/studies'), 'POST', {
    body: { study: recordOf(study), device, shareKey },
  });
  if (r.kind !== 'ok')
    return fail(
      r.kind === 'refused' && r.status === 409
        ? 'Not shared: this study is already shared with a crew. Ask the phone that shared it for the crew code, and join with it.'
        : notDone(r, 'Not shared'),
    );
  const b = r.body;
  if (b?.studyId !== studyId || typeof b.token !== 'string' || typeof b.phoneId !== 'string')
    return fail('Not shared: the crew server answered with something this phone cannot use.');
  const link: CrewLink = {
    studyId,
    server: SERVER,
    token: b.token,
    phoneId: b.phoneId,
    device,
    creator: true,
    crewCode: core.normalizeCrewCode(String(b.crewCode)),
    cursor: null,
    pushedSeq: 0,
    linkedAt: isoWithOffset(deps.now()),
  };
  await saveLink(link);
  void syncStudy(studyId, 'manual');
  return { ok: true, value: link };
}

/**
 * Joins a crew's study with its code: the study is created on this phone from the server's record (after
 * the core's own study rules, as a bundle import checks it) and linked; syncing starts at once.
 */
export async function joinCrew(typed: string): Promise<Done<{ studyId: string; name: string }>> {
  const core = await loadCore();
  const code = core.normalizeCrewCode(typed);
  if (code === null)
    return fail(
      'That is not a crew code: a crew code has 16 letters and digits, shown as four groups of four (like 7K2M-Q9XD-4HVA-P3WE).',
    );
  const device = await deviceId();
  const r = await request<JoinResponse>(deps, apiUrl(SERVER, core.API_PREFIX, '/join'), 'POST', {
    body: { code, device },
  });
  if (r.kind === 'refused' && r.status === 404)
    return fail(
      'Not joined: no crew uses this code now (it may have been replaced or stopped). Ask for the current code.',
    );
  if (r.kind !== 'ok') return fail(notDone(r, 'Not joined'));
  const b = r.body;
  const problems = core.joinAnswerProblems(b);
  if (problems.length > 0)
    return fail(
      `Not joined: the crew server sent a study this phone cannot use (${problems.slice(0, 3).join('; ')}).`,
    );
  const existing = await getLink(b.study.id);
  if (existing?.creator) return { ok: true, value: { studyId: b.study.id, name: b.study.name } };
  const written = await writeImport(b.study, () => ({ ok: true as const, add: [] }));
  if (!written.ok) return fail(`Not joined: ${written.message}.`);
  await saveLink({
    studyId: b.study.id,
    server: SERVER,
    token: b.token,
    phoneId: b.phoneId,
    device,
    creator: false,
    cursor: existing?.cursor ?? null,
    pushedSeq: existing?.pushedSeq ?? 0,
    linkedAt: isoWithOffset(deps.now()),
  });
  void syncStudy(b.study.id, 'manual');
  return { ok: true, value: { studyId: b.study.id, name: written.studyName } };
}

async function creatorCall<T>(
  studyId: string,
  method: 'GET' | 'POST' | 'DELETE',
  path: string,
  what: string,
): Promise<Done<T>> {
  const core = await loadCore();
  const link = await getLink(studyId);
  if (!link) return fail(`${what}: this study is not shared with a crew.`);
  const url = apiUrl(link.server, core.API_PREFIX, `/studies/${encodeURIComponent(studyId)}${path}`);
  const r = await request<T>(deps, url, method, { token: link.token });
  return r.kind === 'ok' ? { ok: true, value: r.body } : fail(notDone(r, what));
}

/** A new crew code (the old one stops working). */
export async function newCode(studyId: string): Promise<Done<string>> {
  const r = await creatorCall<CodeResponse>(studyId, 'POST', '/code', 'No new code');
  if (!r.ok) return r;
  const code = (await loadCore()).normalizeCrewCode(String(r.value?.crewCode));
  if (code === null)
    return fail('No new code: the crew server answered with something that is not a crew code.');
  await updateLink(studyId, (l) => ({ ...l, crewCode: code }));
  return { ok: true, value: code };
}

/** Stops the crew code: no phone can join until a new code is made. */
export async function stopCode(studyId: string): Promise<Done<null>> {
  const r = await creatorCall<undefined>(studyId, 'DELETE', '/code', 'Code not stopped');
  if (!r.ok) return r;
  await updateLink(studyId, (l) => ({ ...l, crewCode: null }));
  return { ok: true, value: null };
}

/** The crew's phones as the server knows them. */
export function crewPhones(studyId: string): Promise<Done<CrewResponse>> {
  return creatorCall<CrewResponse>(studyId, 'GET', '', 'Crew not loaded');
}

/** Removes a phone from the crew: its token stops working (its entries already sent stay). */
export function revokePhone(studyId: string, phoneId: string): Promise<Done<undefined>> {
  return creatorCall<undefined>(
    studyId,
    'DELETE',
    `/phones/${encodeURIComponent(phoneId)}`,
    'Phone not removed',
  );
}
