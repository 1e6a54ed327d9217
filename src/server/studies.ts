/**
 * Study routes: share a study, join it with a crew code, see the crew, replace or withdraw the code,
 * revoke a phone (src/sync/protocol.ts defines every body and status).
 *
 * Secrets: a token is 32 random bytes and a crew code 80 random bits (src/sync/crew-code.ts), both from
 * node:crypto; the database holds only their SHA-256 and looks them up by it. Both are high-entropy
 * random values, so an unsalted fast hash suffices: nothing shorter than the secret itself can be
 * guessed from the hash (OWASP ASVS 4.0.3 V2.9, V3.5: secrets not stored in clear).
 */
import { randomFillSync, randomUUID } from 'node:crypto';
import type { Context } from 'hono';
import { cleanStudy } from '../bundle/bundle.ts';
import type { StudyRecord } from '../model/records.ts';
import { newCrewCode, normalizeCrewCode } from '../sync/crew-code.ts';
import {
  type CodeResponse,
  type CrewResponse,
  type JoinRequest,
  type JoinResponse,
  joinProblems,
  type ShareRequest,
  type ShareResponse,
  shareProblems,
} from '../sync/protocol.ts';
import { authorize, countAttempt, type Limits } from './access.ts';
import type { Db, Queryable } from './db.ts';
import { HttpError, newToken, readJson, sha256 } from './http.ts';

export interface StudyContext {
  db: Db;
  /** Where reads that may lag a little go (a replica); the primary when there is none. */
  readDb: Db;
  limits: Limits;
  clientAddress: (c: Context) => string;
}

const randomCode = () => newCrewCode((bytes) => randomFillSync(bytes));

async function issueCode(tx: Queryable, studyId: string): Promise<string> {
  await tx.query('update crew_codes set active = false where study_id = $1 and active', [studyId]);
  const code = randomCode();
  await tx.query('insert into crew_codes (code_hash, study_id, active) values ($1, $2, true)', [
    sha256(code),
    studyId,
  ]);
  return code;
}

async function addPhone(tx: Queryable, studyId: string, device: string, creator: boolean) {
  const token = newToken();
  const phoneId = randomUUID();
  await tx.query(
    'insert into phones (id, study_id, device, token_hash, creator) values ($1, $2, $3, $4, $5)',
    [phoneId, studyId, device, sha256(token), creator],
  );
  return { token, phoneId };
}

/**
 * A share of a study already shared: the same phone asking again with the same share key (its answer was
 * lost on the way) gets a new token and a new crew code, and the ones it never received stop working;
 * anyone else is refused. The key is compared by its hash, as tokens are.
 */
async function shareAgain(
  tx: Queryable,
  studyId: string,
  req: ShareRequest,
  keyHash: string,
): Promise<ShareResponse> {
  const rows = await tx.query<{ share_key_hash: string | null; phone: string; device: string }>(
    `select s.share_key_hash, p.id::text as phone, p.device from studies s
     join phones p on p.study_id = s.id and p.creator and not p.revoked where s.id = $1 for update`,
    [studyId],
  );
  const creator = rows[0];
  if (creator === undefined || creator.share_key_hash !== keyHash || creator.device !== req.device)
    throw new HttpError(409, `study ${studyId} is already shared; join it with its crew code`);
  const token = newToken();
  await tx.query('update phones set token_hash = $1 where id = $2', [sha256(token), creator.phone]);
  const crewCode = await issueCode(tx, studyId);
  return { studyId, crewCode, token, phoneId: creator.phone };
}

/** POST /studies */
export async function share(c: Context, s: StudyContext): Promise<Response> {
  await countAttempt(s.db, `share:${s.clientAddress(c)}`, s.limits.sharePerAddress);
  const body = await readJson(c);
  const problems = shareProblems(body);
  if (problems.length > 0) throw new HttpError(400, 'the study cannot be shared', problems);
  const req = body as ShareRequest;
  const study = cleanStudy(req.study);
  const keyHash = sha256(req.shareKey);
  const answer = await s.db.transaction(async (tx): Promise<ShareResponse> => {
    const inserted = await tx.query(
      `insert into studies (id, study, share_key_hash) values ($1, $2::jsonb, $3)
       on conflict (id) do nothing returning id`,
      [study.id, JSON.stringify(study), keyHash],
    );
    if (inserted.length === 0) return shareAgain(tx, study.id, req, keyHash);
    const crewCode = await issueCode(tx, study.id);
    const { token, phoneId } = await addPhone(tx, study.id, req.device, true);
    return { studyId: study.id, crewCode, token, phoneId };
  });
  return c.json(answer, 201);
}

/** POST /join */
export async function join(c: Context, s: StudyContext): Promise<Response> {
  // counted before anything is read, so malformed attempts count too
  await countAttempt(s.db, `join:${s.clientAddress(c)}`, s.limits.joinPerAddress);
  await countAttempt(s.db, 'join:*', s.limits.joinGlobal);
  const body = await readJson(c);
  const problems = joinProblems(body);
  if (problems.length > 0) throw new HttpError(400, 'the join request is malformed', problems);
  const req = body as JoinRequest;
  const code = normalizeCrewCode(req.code);
  if (code === null)
    throw new HttpError(400, 'the join request is malformed', [
      'code: not a crew code (16 symbols: digits and letters other than I, L, O and U)',
    ]);
  const answer = await s.db.transaction(async (tx): Promise<JoinResponse | null> => {
    const rows = await tx.query<{ study: StudyRecord }>(
      `select s.study from crew_codes c join studies s on s.id = c.study_id
       where c.code_hash = $1 and c.active`,
      [sha256(code)],
    );
    const study = rows[0]?.study;
    if (study === undefined) return null;
    return { study, ...(await addPhone(tx, study.id, req.device, false)) };
  });
  if (answer === null)
    throw new HttpError(404, 'no study has this crew code (it may have been replaced or withdrawn)');
  return c.json(answer, 200);
}

/** GET /studies/:id */
export async function crew(c: Context, s: StudyContext): Promise<Response> {
  const phone = await authorize(c, s.db, c.req.param('id') ?? '');
  const [studies, phones] = await Promise.all([
    s.readDb.query<{ study: StudyRecord }>('select study from studies where id = $1', [phone.studyId]),
    s.readDb.query<{ id: string; device: string; joined: string; creator: boolean; revoked: boolean }>(
      `select id::text as id, device, creator, revoked,
         to_char(joined_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as joined
       from phones where study_id = $1 order by joined_at, id`,
      [phone.studyId],
    ),
  ]);
  // a phone that has just joined may ask before a lagging replica holds the study: read it from the primary
  const study =
    studies[0]?.study ??
    (await s.db.query<{ study: StudyRecord }>('select study from studies where id = $1', [phone.studyId]))[0]!
      .study;
  const answer: CrewResponse = {
    study,
    phones: phones.map((p) => ({
      phoneId: p.id,
      device: p.device,
      joinedAt: p.joined,
      creator: p.creator,
      revoked: p.revoked,
    })),
    you: phone.id,
  };
  return c.json(answer, 200);
}

/** POST /studies/:id/code — a new code; the old one stops working. */
export async function replaceCode(c: Context, s: StudyContext): Promise<Response> {
  const phone = await authorize(c, s.db, c.req.param('id') ?? '', true);
  const crewCode = await s.db.transaction((tx) => issueCode(tx, phone.studyId));
  const answer: CodeResponse = { crewCode };
  return c.json(answer, 200);
}

/** DELETE /studies/:id/code — no code works until a new one is issued. */
export async function withdrawCode(c: Context, s: StudyContext): Promise<Response> {
  const phone = await authorize(c, s.db, c.req.param('id') ?? '', true);
  await s.db.query('update crew_codes set active = false where study_id = $1 and active', [phone.studyId]);
  return c.body(null, 204);
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

/** DELETE /studies/:id/phones/:phoneId — that phone's token stops working (repeating it changes nothing). */
export async function revokePhone(c: Context, s: StudyContext): Promise<Response> {
  const phone = await authorize(c, s.db, c.req.param('id') ?? '', true);
  const target = c.req.param('phoneId') ?? '';
  if (target === phone.id)
    throw new HttpError(
      400,
      'the sharing phone cannot revoke itself: it alone issues codes and revokes phones',
    );
  const rows = UUID.test(target)
    ? await s.db.query('update phones set revoked = true where id = $1 and study_id = $2 returning id', [
        target,
        phone.studyId,
      ])
    : [];
  if (rows.length === 0) throw new HttpError(404, `no phone ${target.slice(0, 40)} in this study`);
  return c.body(null, 204);
}
