/**
 * `sure-enough merge BUNDLE...`: pools bundles of one study from several phones (src/bundle/merge.ts, by the
 * pooling rule the phone's import shares: src/bundle/pool.ts) and prints the merged bundle on stdout; a
 * summary (events added, likely duplicates, each collector's share) goes to stderr.
 */
import type { Bundle } from '../bundle/bundle.ts';
import { serializeBundle } from '../bundle/bundle.ts';
import { type MergeReport, mergeBundles } from '../bundle/merge.ts';
import { readBundle } from './export.ts';
import { type ParsedArgs, UsageError } from './io.ts';

export const summary = 'pool study bundles of the same study from several phones into one bundle';

export const help = `usage: sure-enough merge BUNDLE BUNDLE...

Each BUNDLE is a file (or - once, for standard input). All must be valid bundles of the same study (same
study id) with identical setups; otherwise nothing is printed and the reason goes to stderr (exit code 2).
Events are pooled as a union by their UUIDs: the same entry or void in several files counts once, and
merging a bundle with itself changes nothing; two voids of one entry (from two phones) are both kept and
the entry counts as voided once. An event id found in two files with different content is refused (one
of the files was altered). When events are added, the log is re-sequenced by time, then device, then
event id (the result does not depend on the order of the files). Entries with the same plot/item label
(and stratum and cluster) from two devices are listed on stderr as likely duplicates; both are kept.
Each collector's (device's) share of the counted entries is listed on stderr too. The app's import of a
bundle follows the same rules.
`;

function describeReport(n: number, bundle: Bundle, added: number, report: MergeReport): string {
  const lines = [
    `merged ${n} bundles of "${bundle.study.name}": ${bundle.events.length} events, ${added} added`,
  ];
  if (report.studyDiffers.length)
    lines.push(
      `  the study records differ in ${report.studyDiffers.join(', ')}; the one created first is kept`,
    );
  for (const s of report.shares)
    lines.push(
      `  ${s.device}: ${s.counted} counted (${(s.share * 100).toFixed(1)} %), ${s.entries - s.counted} voided, ${s.voids} void records`,
    );
  for (const d of report.duplicates)
    lines.push(
      `  likely duplicate: label "${d.label}"${d.stratum !== undefined ? ` in stratum "${d.stratum}"` : ''}${d.cluster !== undefined ? ` cluster "${d.cluster}"` : ''} from ${d.devices.join(', ')} (kept: ${d.ids.join(', ')})`,
    );
  return `${lines.join('\n')}\n`;
}

/** Merges the named bundles; returns the merged bundle text and the summary for stderr. */
export async function mergeFiles(files: readonly string[]): Promise<{ out: string; summary: string }> {
  if (files.length < 2) throw new UsageError(`merge needs at least two BUNDLE files, got ${files.length}`);
  if (files.filter((f) => f === '-').length > 1)
    throw new UsageError('standard input (-) can be given once only');
  const bundles: Bundle[] = [];
  for (const f of files) bundles.push(await readBundle(f));
  let merged = bundles[0]!;
  let added = 0;
  let report: MergeReport | null = null;
  for (let i = 1; i < bundles.length; i++) {
    const r = await mergeBundles(merged, bundles[i]!);
    if (!r.ok) throw new UsageError(`${files[i]}: ${r.message}`);
    merged = r.bundle;
    added += r.report.added;
    report = r.report;
  }
  return { out: serializeBundle(merged), summary: describeReport(files.length, merged, added, report!) };
}

/** merge takes only BUNDLE files. */
export const flags = {};

export async function run(args: ParsedArgs): Promise<string> {
  const { out, summary: text } = await mergeFiles(args.positional);
  process.stderr.write(text);
  return out;
}
