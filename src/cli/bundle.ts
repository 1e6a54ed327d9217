/**
 * `sure-enough bundle [FILE|-]`: values (as for `assess`, including `<RL` non-detects for measurements)
 * plus the study flags → a study bundle (src/bundle/SCHEMA.md) the app can import and `merge` can pool.
 * Own flags (all optional): --name, --unit, --device, --at, --id, --outcome, --taxon, --protocol,
 * --plot-area-unit, --reporting-limit, --notes (documented in `sure-enough help bundle`).
 */
import { randomUUID } from 'node:crypto';
import { makeBundle, serializeBundle } from '../bundle/bundle.ts';
import { derivedUuid, formatIso, shiftIso } from '../bundle/ids.ts';
import { isIsoTimeWithOffset, isUuid } from '../bundle/validate.ts';
import type { ObservationRecord, StudyRecord, StudySetup } from '../model/records.ts';
import { parseValues } from '../validate/parse-values.ts';
import { type ParsedArgs, readInput, UsageError } from './io.ts';
import { parseStudyFlags, rejectUnknownFlags } from './study-flags.ts';

export const summary = 'build a study bundle (JSON) the app can import from a list of values';

const OWN_FLAGS = [
  'name',
  'unit',
  'device',
  'at',
  'id',
  'outcome',
  'taxon',
  'protocol',
  'plot-area-unit',
  'reporting-limit',
  'notes',
];

export const help = `usage: sure-enough bundle [FILE|-] --kind KIND [study flags] [bundle flags]

Reads values as assess does (one per line, or a CSV with a "value" column; <RL marks a measurement below a
reporting limit) and prints a study bundle (format "sure-enough-bundle", version 1) on stdout: the study's
setup and one entry per value, with a SHA-256 checksum. The app imports it; \`merge\` pools it with bundles
from phones of the same study (same --id and identical setup).

Bundle flags:
  --name TEXT           study name (default "Imported values")
  --unit UCUM           unit of the values, a UCUM code where there is one (mg/kg, ug/L); measurements
  --device TEXT         collector / source recorded on every entry (default "import")
  --at TIME             RFC 3339 time with UTC offset of the first entry (default: now, local offset);
                        entry i is timed --at + (i − 1) seconds so the order survives a merge;
                        also the study's createdAt
  --id UUID             study id (lower-case UUID). Give the id of an existing study to pool with it.
                        Default: a new random id. Event ids are derived from the study id, --device, --at
                        and the entry number (UUID version 8 from SHA-256): the same input and flags give
                        the same ids (pooling it twice changes nothing); another device or start time gives
                        other ids.
  --outcome TEXT        what is measured or counted, in words
  --taxon NAME          scientific name of the counted taxon (counts; needed by export --format dwc)
  --protocol TEXT       sampling protocol in words (Darwin Core samplingProtocol)
  --plot-area-unit UCUM unit of --plot-area (e.g. m2)
  --reporting-limit RL  laboratory reporting limit, in --unit (measurements)
  --notes TEXT          study notes
`;

function optionalText(flags: Map<string, string>, name: string): string | undefined {
  const v = flags.get(name);
  if (v === undefined) return undefined;
  if (v.trim() === '') throw new UsageError(`flag --${name}: must not be empty`);
  return v;
}

export function run(args: ParsedArgs): string {
  rejectUnknownFlags(args.flags, OWN_FLAGS);
  if (args.positional.length > 1)
    throw new UsageError(
      `bundle takes one input (FILE or -), got ${args.positional.length}: ${args.positional.join(' ')}`,
    );
  const analysis = parseStudyFlags(args.flags);
  const f = args.flags;
  const setup: StudySetup = { ...analysis };
  const unit = optionalText(f, 'unit');
  if (unit !== undefined) setup.unit = unit;
  const outcome = optionalText(f, 'outcome');
  if (outcome !== undefined) setup.outcomeName = outcome;
  const taxon = optionalText(f, 'taxon');
  if (taxon !== undefined) {
    if (setup.kind !== 'count') throw new UsageError('flag --taxon applies to counts only (--kind count)');
    setup.taxon = taxon;
  }
  const protocol = optionalText(f, 'protocol');
  if (protocol !== undefined) setup.samplingProtocol = protocol;
  const areaUnit = optionalText(f, 'plot-area-unit');
  if (areaUnit !== undefined) {
    if (setup.plotArea === undefined) throw new UsageError('flag --plot-area-unit needs --plot-area');
    setup.plotAreaUnit = areaUnit;
  }
  const rl = f.get('reporting-limit');
  if (rl !== undefined) {
    if (setup.kind !== 'measurement')
      throw new UsageError('flag --reporting-limit applies to measurements only');
    const v = Number(rl.trim());
    if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(rl.trim()) || !(v > 0))
      throw new UsageError(`flag --reporting-limit: "${rl}" is not a number above 0`);
    setup.reportingLimit = v;
  }
  const id = f.get('id') ?? randomUUID();
  if (!isUuid(id))
    throw new UsageError(`flag --id: "${id}" is not a lower-case UUID (8-4-4-4-12 hexadecimal digits)`);
  const at = f.get('at') ?? formatIso(Math.floor(Date.now() / 1000) * 1000, -new Date().getTimezoneOffset());
  if (!isIsoTimeWithOffset(at))
    throw new UsageError(
      `flag --at: "${at}" is not an RFC 3339 time with UTC offset (e.g. 2026-05-04T09:15:00+02:00)`,
    );
  const device = optionalText(f, 'device') ?? 'import';
  const name = optionalText(f, 'name') ?? 'Imported values';

  const text = readInput(args.positional[0]);
  const parsed = parseValues(text, setup.kind);
  if (!parsed.ok) throw new UsageError(parsed.errors.join('\n'));
  if (parsed.points.length === 0)
    throw new UsageError(`${args.positional[0] ?? 'standard input'}: no values found`);

  const study: StudyRecord = { id, name, createdAt: at, setup, version: 1 };
  const notes = optionalText(f, 'notes');
  if (notes !== undefined) study.notes = notes;
  const events: ObservationRecord[] = parsed.points.map((p, i) => {
    const e: ObservationRecord = {
      id: derivedUuid(`${id}/${device}/${at}/${i + 1}`),
      studyId: id,
      seq: i + 1,
      at: shiftIso(at, i),
      value: p.value,
      device,
    };
    if (p.censored) e.censored = true;
    return e;
  });
  return serializeBundle(makeBundle(study, events));
}
