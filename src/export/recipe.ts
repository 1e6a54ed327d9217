/**
 * The reproduction recipe of the report: the counted entries written as input for `sure-enough assess`
 * (`assessInputCsv`, also `sure-enough export --format values`) and the study flags that rebuild the
 * study's setup (`assessFlags`), so that
 *
 *   sure-enough export --format values STUDY.bundle.json > values.csv
 *   sure-enough assess FLAGS values.csv
 *
 * prints the report's n, estimate, interval, level and verdict exactly (same numbers to the last bit:
 * values and settings are written in ECMAScript's shortest round-trip number form, so parsing them gives
 * back the same doubles, and the entries keep their log order).
 *
 * The values file is a CSV (RFC 4180 quoting, see rfc4180.ts) with a `value` column — a non-detect is
 * written `<RL` — and `stratum` / `cluster` columns when any counted entry carries one (the input rules of
 * src/cli/README.md, "Input"). The flags are written for a POSIX shell: any word other than letters,
 * digits and `_ - . , : / = + @ %` is single-quoted (POSIX.1-2017, Shell Command Language §2.2.2).
 *
 * `recipeGaps` lists what the values file and the flags cannot express (e.g. a stratum's number of units,
 * a name with leading spaces); the report then says the recipe is not exact, and why.
 *
 * The exact route in every case is `sure-enough assess study.bundle.json` (`bundleCommand`): `assess`
 * reads the bundle itself and uses its setup, so nothing has to pass through flags or a values file.
 */
import type { Bundle } from '../bundle/bundle.ts';
import { countedEntries } from '../bundle/events.ts';
import type { StudySetup } from '../model/records.ts';
import type { StratumSetup } from '../model/types.ts';
import { csvText } from './rfc4180.ts';

/** Quotes one word for a POSIX shell when it needs it. */
export function shellWord(word: string): string {
  return /^[A-Za-z0-9_\-.,:/=+@%]+$/.test(word) ? word : `'${word.replace(/'/g, `'\\''`)}'`;
}

/** `--strata` text (and `--cost` when any stratum has a cost): `;` between strata when a name holds a comma. */
function strataFlags(strata: readonly StratumSetup[]): { strata: string; cost?: string } {
  const sep = strata.some((s) => s.name.includes(',')) ? ';' : ',';
  const out: { strata: string; cost?: string } = {
    strata: strata.map((s) => `${s.name}:${s.weight}`).join(sep),
  };
  const costed = strata.filter((s) => s.cost !== undefined);
  if (costed.length > 0) out.cost = costed.map((s) => `${s.name}:${s.cost}`).join(sep);
  return out;
}

/** The `sure-enough assess` arguments that rebuild this setup (CLI study flags), as argv words. */
export function assessArgs(setup: StudySetup): string[] {
  const f: string[] = ['--kind', setup.kind, '--level', String(setup.level), '--sided', setup.sided];
  if (setup.method) f.push('--method', setup.method);
  if (setup.target) f.push('--target', `${setup.target.kind}:${setup.target.value}`);
  f.push('--rule', setup.rule, '--min', String(setup.min));
  if (setup.hotSpotShare !== undefined) f.push('--hot-spot-share', String(setup.hotSpotShare));
  if (setup.population !== undefined) f.push('--population', String(setup.population));
  if (setup.plotArea !== undefined) f.push('--plot-area', String(setup.plotArea));
  if (setup.max !== undefined) f.push('--max', String(setup.max));
  const p = setup.planning;
  if (p?.negBinomialK !== undefined) f.push('--nb-k', String(p.negBinomialK));
  if (p?.taylorA !== undefined && p.taylorB !== undefined)
    f.push('--taylor-a', String(p.taylorA), '--taylor-b', String(p.taylorB));
  if (p?.iwaoAlpha !== undefined && p.iwaoBeta !== undefined)
    f.push('--iwao-alpha', String(p.iwaoAlpha), '--iwao-beta', String(p.iwaoBeta));
  if (setup.sprt)
    f.push(
      '--sprt-alpha',
      String(setup.sprt.alpha),
      '--sprt-beta',
      String(setup.sprt.beta),
      '--sprt-lower',
      String(setup.sprt.lowerBound),
      '--sprt-upper',
      String(setup.sprt.upperBound),
    );
  if (setup.strata !== undefined && setup.strata.length > 0) {
    const s = strataFlags(setup.strata);
    f.push('--strata', s.strata);
    if (s.cost !== undefined) f.push('--cost', s.cost);
  }
  if (setup.design !== undefined) f.push('--design', setup.design);
  if (setup.nonDetects !== undefined) f.push('--non-detects', setup.nonDetects);
  return f;
}

/** The `sure-enough assess` flags that reproduce this setup, quoted for a POSIX shell. */
export function assessFlags(setup: StudySetup): string {
  return assessArgs(setup).map(shellWord).join(' ');
}

const trimmed = (s: string) => s === s.trim() && s !== '';

/**
 * What the recipe cannot carry for this bundle (empty when it reproduces the numbers exactly): settings
 * without a command-line flag, and names that the values file or --strata would change.
 */
export function recipeGaps(bundle: Bundle): string[] {
  const setup = bundle.study.setup;
  const gaps: string[] = [];
  for (const s of setup.strata ?? []) {
    if (s.population !== undefined)
      gaps.push(
        `stratum "${s.name}" has a number of units (${s.population}) for the finite population correction, which no command-line flag carries`,
      );
    if (!trimmed(s.name) || s.name.includes(';') || /[\r\n]/.test(s.name))
      gaps.push(
        `stratum name "${s.name}" cannot be written in --strata (leading or trailing spaces, ";" or a line break)`,
      );
  }
  if (setup.sprt?.maxN !== undefined && setup.sprt.maxN !== setup.max)
    gaps.push(
      `the SPRT truncation (${setup.sprt.maxN}) differs from the planned maximum; the command line sets both with --max`,
    );
  if (setup.design !== undefined && setup.strata !== undefined && setup.strata.length > 0)
    gaps.push('composites within strata cannot be set on the command line');
  const bad = new Set<string>();
  for (const e of countedEntries(bundle.events))
    for (const v of [e.stratum, e.cluster])
      if (v !== undefined && (!trimmed(v) || /[\r\n]/.test(v))) bad.add(v);
  for (const v of bad)
    gaps.push(
      `the stratum or primary unit "${v}" has leading or trailing spaces or a line break, which the values file cannot carry`,
    );
  return gaps;
}

/**
 * The counted entries (log order) as a values file for `sure-enough assess`: `value` (`<RL` for a
 * non-detect) and, when any entry carries them, `stratum` and `cluster` (RFC 4180, CRLF).
 */
export function assessInputCsv(bundle: Bundle): string {
  const entries = countedEntries(bundle.events);
  const withStratum = entries.some((e) => e.stratum !== undefined);
  const withCluster = entries.some((e) => e.cluster !== undefined);
  const header = ['value'];
  if (withStratum) header.push('stratum');
  if (withCluster) header.push('cluster');
  const rows = entries.map((e) => {
    const r: (string | undefined)[] = [`${e.censored ? '<' : ''}${e.value as number}`];
    if (withStratum) r.push(e.stratum);
    if (withCluster) r.push(e.cluster);
    return r;
  });
  return csvText([header, ...rows]);
}

/** The one command that reproduces the figures exactly from the bundle itself (its own setup). */
export function bundleCommand(bundleFile = 'study.bundle.json'): string {
  return `sure-enough assess ${shellWord(bundleFile)}`;
}

/** The two commands of the recipe, for a bundle saved as `bundleFile` (shell-quoted). */
export function recipeCommands(setup: StudySetup, bundleFile = 'study.bundle.json'): [string, string] {
  return [
    `sure-enough export --format values ${shellWord(bundleFile)} > values.csv`,
    `sure-enough assess ${assessFlags(setup)} values.csv`,
  ];
}
