/**
 * JSON output files: keys in snake_case (README.md in this folder), NaN as null, a final newline. `snakeKeys` converts the camelCase field names of an in-memory result;
 * it must only be given objects whose keys are field names, never names chosen by a person.
 */

/** Keys whose digits belong to a word of their own. */
const SPECIAL: Record<string, string> = { yearsTo90: 'years_to_90' };

export function snakeKey(k: string): string {
  return SPECIAL[k] ?? k.replace(/([a-z0-9])([A-Z])/g, '$1_$2').toLowerCase();
}

export function camelKey(k: string): string {
  return k.replace(/_([a-z0-9])/g, (_m, c: string) => c.toUpperCase());
}

function mapKeys(v: unknown, f: (k: string) => string, keep: ReadonlySet<string>): unknown {
  if (Array.isArray(v)) return v.map((x) => mapKeys(x, f, keep));
  if (v === null || typeof v !== 'object') return v;
  const out: Record<string, unknown> = {};
  for (const [k, x] of Object.entries(v)) out[f(k)] = keep.has(k) ? x : mapKeys(x, f, keep);
  return out;
}

/** Every key of the tree in snake_case (values under keys in `keep` are left as they are). */
export function snakeKeys(v: unknown, keep: ReadonlySet<string> = new Set()): unknown {
  return mapKeys(v, snakeKey, keep);
}

/** The inverse, for reading a file back into an in-memory result (older camelCase files pass unchanged). */
export function camelKeys(v: unknown, keep: ReadonlySet<string> = new Set()): unknown {
  return mapKeys(v, camelKey, keep);
}

/** A JSON file's text (JSON.stringify writes NaN as null); `indent` 1 for files people open, 0 for long arrays. */
export function jsonText(v: unknown, indent = 0): string {
  return JSON.stringify(v, null, indent) + '\n';
}
