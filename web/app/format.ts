/**
 * Screen-only formatting. The words for figures, units, levels, targets and verdicts are the core's one
 * module of words (src/words, reached through core-light.ts), shared with the report file.
 */

/** The clock time of an ISO 8601 time stamp ("14:03:27"), for the log's rows. */
export function timeText(iso: string): string {
  const m = /T(\d\d:\d\d:\d\d)/.exec(iso);
  return m ? (m[1] as string) : iso;
}

/** An ISO 8601 time stamp with a space for the T and without fractions of a second. */
export function dateTimeText(iso: string): string {
  return iso.replace('T', ' ').replace(/\.\d+/, '');
}
