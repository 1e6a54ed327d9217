/** ISO 8601 / RFC 3339 local date-time with the UTC offset, e.g. 2026-12-01T14:03:07.120+01:00. */
export function isoWithOffset(d: Date = new Date()): string {
  const p = (n: number, w = 2) => String(Math.abs(n)).padStart(w, '0');
  const off = -d.getTimezoneOffset();
  const sign = off >= 0 ? '+' : '-';
  return (
    `${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())}T${p(d.getHours())}:${p(d.getMinutes())}:` +
    `${p(d.getSeconds())}.${p(d.getMilliseconds(), 3)}${sign}${p(Math.trunc(off / 60))}:${p(off % 60)}`
  );
}
