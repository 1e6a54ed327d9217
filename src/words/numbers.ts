/**
 * Numbers for reading. The figures themselves come unrounded from the core; these functions only decide how
 * many digits a person sees. The decimal separator is a parameter (default '.') so that a study's own
 * separator can be passed later without changing the callers' wording.
 */

/** Replaces the decimal point of a formatted number by `sep`. */
export function withSeparator(text: string, sep = '.'): string {
  return sep === '.' ? text : text.replace('.', sep);
}

/**
 * Decimals so that the interval's half-width shows two significant digits (0–6 decimals), and the estimate
 * and bounds are rounded to the same decimal place: the practice of JCGM 100:2008 (GUM), §7.2.6, which
 * quotes an uncertainty with at most two significant digits and the estimate to match.
 */
export function decimalsFor(halfWidth: number | null, fallback = 2): number {
  if (halfWidth === null || !(halfWidth > 0) || !Number.isFinite(halfWidth)) return fallback;
  return Math.min(6, Math.max(0, 1 - Math.floor(Math.log10(halfWidth))));
}

/** `x` with a fixed number of decimals. */
export function fixed(x: number, decimals: number, sep = '.'): string {
  return withSeparator(x.toFixed(decimals), sep);
}

/**
 * A value someone typed (a target, a limit, a weight): as typed, without binary noise (0.1 + 0.2 reads 0.3),
 * at most 6 significant digits.
 */
export function plain(x: number, sep = '.'): string {
  return withSeparator(String(Number(x.toPrecision(6))), sep);
}

/**
 * A figure with no interval to set its precision (chart ticks): up to 4 significant digits, an exponent only
 * outside everyday magnitudes; '—' when there is no finite number.
 */
export function readable(x: number | null | undefined, sep = '.'): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-4 && a < 1e9) return withSeparator(String(Number(x.toPrecision(4))), sep);
  return withSeparator(x.toExponential(3), sep);
}

/**
 * A fraction as a percentage with up to 4 significant digits: 0.05 → "5 %", 1/3 → "33.33 %". A space stands
 * between the number and the sign, as the SI Brochure (BIPM, 9th edition, 2019) writes it.
 */
export function percent(fraction: number, sep = '.'): string {
  return `${withSeparator(String(Number((fraction * 100).toPrecision(4))), sep)} %`;
}

/**
 * A confidence level in words: whole percents as "95 %", otherwise one decimal ("93.6 %", not "93.5808 %"),
 * more only when one decimal would read as 0 % or 100 % ("99.95 %").
 */
export function levelWords(level: number, sep = '.'): string {
  const p = level * 100;
  for (const d of [0, 1]) if (Math.abs(Number(p.toFixed(d)) - p) < 1e-9) return `${fixed(p, d, sep)} %`;
  let d = 1;
  while (d < 6 && (Number(p.toFixed(d)) >= 100 || Number(p.toFixed(d)) <= 0)) d++;
  return `${fixed(p, d, sep)} %`;
}
