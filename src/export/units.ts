/**
 * Units in column names and words: a UCUM code (Regenstrief, "The Unified Code for Units of Measure")
 * becomes a header-safe slug (`mg/kg` → `mg_per_kg`, `ug/L` → `ug_per_L`, `%` → `percent`), and a few
 * common area codes become words for Darwin Core's `sampleSizeUnit` (`m2` → `square metre`).
 */

export function unitSlug(unit: string): string {
  return unit
    .trim()
    .replace(/%/g, 'percent')
    .replace(/[µμ]/g, 'u')
    .replace(/\//g, '_per_')
    .replace(/[{}[\]]/g, '')
    .replace(/[^A-Za-z0-9_]+/g, '_')
    .replace(/_+/g, '_')
    .replace(/^_|_$/g, '');
}

const AREA_WORDS: Record<string, string> = {
  m2: 'square metre',
  'm^2': 'square metre',
  cm2: 'square centimetre',
  dm2: 'square decimetre',
  km2: 'square kilometre',
  ha: 'hectare',
  har: 'hectare',
  ar: 'are',
  ft2: 'square foot',
  '[sft_i]': 'square foot',
};

/** Plot-area unit in words for Darwin Core `sampleSizeUnit` (unknown codes are passed through). */
export function areaUnitWords(unit: string): string {
  return AREA_WORDS[unit.trim()] ?? unit.trim();
}
