/**
 * CSV text by RFC 4180 (Shafranovich 2005), "Common Format and MIME Type for CSV Files", §2:
 * records end with CRLF (rule 1–2, the last one too), a header record first (rule 3), fields separated by
 * commas (rule 4), a field is enclosed in double quotes when it contains a comma, a double quote, CR or
 * LF (rule 6), and a double quote inside a field is written twice (rule 7). Text is UTF-8 (RFC 7111 /
 * the text/csv charset parameter), written without a byte-order mark.
 *
 * @example csvText([['a', 'b'], ['1', 'x, "y"']]) === 'a,b\r\n1,"x, ""y"""\r\n'
 */

/** One field: numbers as ECMAScript prints them (shortest round-trip), empty for null/undefined. */
export function csvField(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return '';
  const text = typeof value === 'string' ? value : String(value);
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvText(
  rows: readonly (readonly (string | number | boolean | null | undefined)[])[],
): string {
  return rows.map((r) => `${r.map(csvField).join(',')}\r\n`).join('');
}
