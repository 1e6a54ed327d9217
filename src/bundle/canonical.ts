/**
 * Canonical JSON — answers "which exact text does the bundle checksum cover?"
 *
 * Source: RFC 8785 (Rundgren, Jordan & Erdtman 2020), JSON Canonicalization Scheme (JCS): object members
 * sorted by their names compared as UTF-16 code units (§3.2.3), no whitespace (§3.2.1), strings and
 * numbers serialised as ECMAScript JSON.stringify does (§3.2.2.2, §3.2.2.3).
 * Preconditions: plain JSON data (objects, arrays, strings, finite numbers, booleans, null); object
 * members whose value is `undefined` are left out, as JSON.stringify does.
 * Returns: the canonical text (a string; hash its UTF-8 bytes).
 * Validity: throws RangeError for non-finite numbers and for values JSON cannot represent.
 *
 * @example canonicalJson({ b: [1, 'x'], a: null }) === '{"a":null,"b":[1,"x"]}'
 */
export function canonicalJson(value: unknown): string {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'boolean':
      return value ? 'true' : 'false';
    case 'number':
      if (!Number.isFinite(value)) throw new RangeError('canonicalJson requires finite numbers');
      return JSON.stringify(value);
    case 'string':
      return JSON.stringify(value);
    case 'object': {
      if (Array.isArray(value)) return `[${value.map((v) => canonicalJson(v ?? null)).join(',')}]`;
      const obj = value as Record<string, unknown>;
      const keys = Object.keys(obj)
        .filter((k) => obj[k] !== undefined)
        .sort();
      return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(',')}}`;
    }
    default:
      throw new RangeError(`canonicalJson requires JSON data, got ${typeof value}`);
  }
}
