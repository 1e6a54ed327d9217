/**
 * Satterthwaite effective degrees of freedom — how many degrees of freedom a sum of independent variance
 * estimates is worth, for the t quantile of a stratified (or otherwise pooled) interval.
 *
 * Source: Satterthwaite FE (1946) An approximate distribution of estimates of variance components,
 * Biometrics Bulletin 2:110–114; as used for the stratified mean in Cochran WG (1977) Sampling
 * Techniques, 3rd ed., §5.4: n_e = (Σ g_h s_h²)² / Σ [(g_h s_h²)² / (n_h − 1)], here with each component
 * v_h = g_h s_h² given directly.
 * Preconditions: every component v_h ≥ 0 with df_h > 0.
 * Returns: the effective df (between min df_h and Σ df_h), or null when every component is zero.
 * Validity: an approximation (moment matching of a scaled χ²); good when each df_h is not tiny.
 * @example satterthwaiteDf([{ v: 1, df: 9 }, { v: 1, df: 9 }]) // 18
 */
export function satterthwaiteDf(components: readonly { v: number; df: number }[]): number | null {
  let num = 0;
  let den = 0;
  for (const { v, df } of components) {
    if (!(Number.isFinite(v) && v >= 0)) throw new RangeError('satterthwaiteDf requires every v >= 0');
    if (!(df > 0)) throw new RangeError('satterthwaiteDf requires every df > 0');
    num += v;
    den += (v * v) / df;
  }
  if (num === 0) return null;
  return (num * num) / den;
}
