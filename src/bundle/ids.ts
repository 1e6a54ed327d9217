/**
 * Identifiers and times for records built outside the app (the `bundle` command).
 *
 * `derivedUuid(seed)`: a name-based UUID — RFC 9562 §5.8 (UUID version 8, custom) with the first 122 bits
 * of SHA-256(seed) — so a bundle built twice from the same input and study id has the same event ids
 * (re-importing it changes nothing), while different seeds collide with negligible probability.
 * `shiftIso(time, seconds)`: an RFC 3339 time moved by whole seconds, keeping its UTC offset.
 *
 * @example (await derivedUuid('x')).length === 36
 */
import { sha256Hex } from './digest.ts';

export async function derivedUuid(seed: string): Promise<string> {
  const h = (await sha256Hex(seed)).split('');
  h[12] = '8'; // version 8
  h[16] = ((Number.parseInt(h[16]!, 16) & 0x3) | 0x8).toString(16); // variant 10xx
  const s = h.join('');
  return `${s.slice(0, 8)}-${s.slice(8, 12)}-${s.slice(12, 16)}-${s.slice(16, 20)}-${s.slice(20, 32)}`;
}

const pad = (n: number, w = 2) => String(n).padStart(w, '0');

/** Formats an instant (ms since epoch) as RFC 3339 with the given offset in minutes east of UTC. */
export function formatIso(ms: number, offsetMinutes: number): string {
  const d = new Date(ms + offsetMinutes * 60_000);
  const base = `${pad(d.getUTCFullYear(), 4)}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}T${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:${pad(d.getUTCSeconds())}`;
  const frac = d.getUTCMilliseconds() ? `.${pad(d.getUTCMilliseconds(), 3)}` : '';
  if (offsetMinutes === 0) return `${base}${frac}Z`;
  const sign = offsetMinutes > 0 ? '+' : '-';
  const a = Math.abs(offsetMinutes);
  return `${base}${frac}${sign}${pad(Math.floor(a / 60))}:${pad(a % 60)}`;
}

/** Offset in minutes east of UTC written in an RFC 3339 time (`Z` = 0). */
export function offsetOf(time: string): number {
  const m = /(Z|([+-])(\d{2}):(\d{2}))$/.exec(time);
  if (!m || m[1] === 'Z') return 0;
  const v = Number(m[3]) * 60 + Number(m[4]);
  return m[2] === '-' ? -v : v;
}

export function shiftIso(time: string, seconds: number): string {
  return formatIso(Date.parse(time) + seconds * 1000, offsetOf(time));
}
