/**
 * The crew server's request validators (src/sync/protocol.ts) and crew codes (src/sync/crew-code.ts).
 * Outside references: Crockford's Base32 (crockford.com/base32.html; from memory): the 32 symbols are the
 * digits and the capital letters without I, L, O and U, and a decoder reads I and L as 1 and O as 0, in
 * either case, ignoring hyphens. RFC 9562 for the UUID text form the bundle rules require. The rest are the
 * bundle's own rules, which must read the same on the server (the messages name the field).
 */
import { webcrypto } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import type { ObservationRecord } from '../../../src/model/records.ts';
import {
  CREW_CODE_ALPHABET,
  formatCrewCode,
  newCrewCode,
  normalizeCrewCode,
} from '../../../src/sync/crew-code.ts';
import { joinProblems, MAX_BATCH_EVENTS, pushProblems, shareProblems } from '../../../src/sync/protocol.ts';
import { entries, study, uuid, voidOf } from '../bundle/make.ts';

const random = (b: Uint8Array) => webcrypto.getRandomValues(b);

describe('crew codes (Crockford Base32)', () => {
  it('uses the 32 symbols of the published alphabet', () => {
    expect(CREW_CODE_ALPHABET).toBe('0123456789ABCDEFGHJKMNPQRSTVWXYZ');
  });
  it('reads a code typed in any case, spaced or hyphenated, with O/I/L for 0/1/1', () => {
    const code = '7K2MQ9XD4HVAP3WE';
    expect(normalizeCrewCode(formatCrewCode(code))).toBe(code);
    expect(formatCrewCode(code)).toBe('7K2M-Q9XD-4HVA-P3WE');
    expect(normalizeCrewCode(' 7k2m q9xd-4hva p3we ')).toBe(code);
    expect(normalizeCrewCode('O1IL-0000-0000-0000')).toBe('0111000000000000');
  });
  it('refuses what is not a code: U, other symbols, one symbol too many or too few', () => {
    expect(normalizeCrewCode('7K2M-Q9XD-4HVA-P3WU')).toBeNull();
    expect(normalizeCrewCode('7K2M-Q9XD-4HVA-P3W!')).toBeNull();
    expect(normalizeCrewCode('7K2M-Q9XD-4HVA-P3W')).toBeNull();
    expect(normalizeCrewCode('7K2M-Q9XD-4HVA-P3WEE')).toBeNull();
  });
  it('new codes are 16 symbols, every symbol about equally often (80 bits)', () => {
    const counts = new Map<string, number>();
    const codes = 4000;
    for (let i = 0; i < codes; i++) {
      const code = newCrewCode(random);
      expect(normalizeCrewCode(code)).toBe(code);
      for (const ch of code) counts.set(ch, (counts.get(ch) ?? 0) + 1);
    }
    expect(counts.size).toBe(32);
    // 64,000 symbols, 2,000 expected each; sd ≈ 44: ±300 is beyond 6 sd
    for (const n of counts.values()) expect(Math.abs(n - 2000)).toBeLessThan(300);
  });
});

describe('request validators', () => {
  const st = study();
  it('a share names each problem by its field, the setup through the one validator', () => {
    const shareKey = 'A'.repeat(43);
    expect(shareProblems({ study: st, device: 'phone-A', shareKey })).toEqual([]);
    const bad = { ...st, setup: { ...st.setup, level: 1.5 } };
    const problems = shareProblems({ study: bad, device: '', extra: 1, shareKey: 'short' });
    expect(problems).toContain('shareKey: must be 32 random bytes in base64url (43 characters)');
    expect(problems).toContain('extra: unknown field');
    expect(problems).toContain('device: must not be empty');
    expect(problems.some((p) => p.startsWith('study.setup.level:'))).toBe(true);
    expect(shareProblems('[]')).toHaveLength(1);
  });
  it('a join needs a code and a device', () => {
    expect(joinProblems({ code: 'x', device: 'd' })).toEqual([]);
    expect(joinProblems({ device: 'd' })).toEqual(['code: missing or not text']);
  });
  it('a push: own events of this study only, ids unique, values by the data kind, at most a batch', () => {
    const own = entries(st, [3, 0, 5], 'phone-A', 2);
    const voidEvent = voidOf(st, own[1]!, 4, uuid(3, 1));
    expect(pushProblems({ events: [...own, voidEvent] }, st, 'phone-A')).toEqual([]);
    const foreign = entries(st, [1], 'phone-B', 5);
    expect(pushProblems({ events: foreign }, st, 'phone-A')).toEqual([
      'events[0].device: "phone-B" is not this phone; a phone sends only its own events',
    ]);
    expect(pushProblems({ events: [own[0], own[0]] }, st, 'phone-A')).toEqual([
      'events[1].id: same id as events[0]',
    ]);
    const negative: ObservationRecord = { ...own[0]!, value: -2 };
    const otherStudy: ObservationRecord = { ...own[1]!, studyId: uuid(9, 9) };
    const p = pushProblems({ events: [negative, otherStudy] }, st, 'phone-A');
    expect(p.some((x) => x.startsWith('events[0].value:'))).toBe(true);
    expect(p.some((x) => x.startsWith('events[1].studyId:'))).toBe(true);
    expect(pushProblems({ events: [] }, st, 'phone-A')).toEqual(['events: empty (send 1 or more events)']);
    const many = entries(
      st,
      Array.from({ length: MAX_BATCH_EVENTS + 1 }, () => 1),
      'phone-A',
      6,
    );
    expect(pushProblems({ events: many }, st, 'phone-A')).toEqual([
      `events: ${MAX_BATCH_EVENTS + 1} events; send at most ${MAX_BATCH_EVENTS} per request`,
    ]);
    expect(pushProblems({ events: own, more: 1 }, st, 'phone-A')).toEqual(['more: unknown field']);
    // seq is the event's place in its own phone's log: any whole number ≥ 1, not its index in the batch
    expect(pushProblems({ events: [{ ...own[2]!, seq: 40 }] }, st, 'phone-A')).toEqual([]);
    expect(pushProblems({ events: [{ ...own[2]!, seq: 0 }] }, st, 'phone-A')).toEqual([
      'events[0].seq: must be a whole number ≥ 1, got 0',
    ]);
  });
});
